// Sending a week's crew sheets by e-mail: to the farm's crew leads and owners and/or addresses
// typed in, one message each (so typed-in addresses are not shown to everyone), with the .xlsx.
import { db } from '../db';
import { sendMail } from '../mail';
import { weekMail } from './mail-body';
import { weekWorkbook } from './workbook';
import type { WeekSheet } from './week';

/** E-mail addresses of this farm's owners and crew leads. */
export async function crewAddresses(farmId: number): Promise<string[]> {
	const rows: { email: string }[] = await db()('farm_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.farm_id', farmId)
		.whereIn('m.role', ['owner', 'crew_lead'])
		.orderBy('u.email')
		.select('u.email');
	return rows.map((r) => r.email.toLowerCase());
}

export interface SendInput {
	sheet: WeekSheet;
	farmName: string;
	seasonName: string;
	link: string;
	sender: string;
	recipients: string[];
}

/** Sends the sheets; returns the addresses written to (deduplicated). */
export async function sendWeekSheets(input: SendInput): Promise<string[]> {
	const to = [...new Set(input.recipients.map((r) => r.toLowerCase()))];
	const body = weekMail(input.sheet, input.farmName, input.seasonName, input.link, input.sender);
	const xlsx = await weekWorkbook(input.sheet, body.subject, input.farmName);
	const attachment = {
		filename: `crew-sheets-${input.sheet.week}.xlsx`,
		content: xlsx,
		contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'
	};
	for (const address of to)
		await sendMail({ to: address, subject: body.subject, text: body.text, html: body.html, attachments: [attachment] });
	return to;
}
