// The e-mail that carries a week's crew sheets: a plain HTML summary (inline styles only, as mail
// readers strip style sheets) and its text twin; the full sheets travel as the attached .xlsx.
import { plural } from '$lib/plural';
import { formatWeekDate } from '$lib/planning';
import { cautionsFor } from './cautions';
import type { SheetRow, SheetSection, WeekSheet } from './week';

function esc(s: string): string {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function place(r: SheetRow): string {
	return r.bed ? `${r.block} · ${r.bed}, ${r.startFt}–${r.endFt} ft` : 'not placed';
}

function detail(kind: SheetSection['kind'], r: SheetRow): string {
	const s = r.seed;
	switch (kind) {
		case 'tray_sow':
			return s
				? `${plural(s.cells, 'cell')} · ${plural(s.trays, 'tray')} of ${r.cellsPerTray} · ${s.grams} g seed`
				: 'seed figures missing';
		case 'direct_sow':
			return (
				`${plural(r.rows, 'row')} at ${r.inRowSpacingIn} in · ${plural(r.seedsPerSpot, 'seed')} per spot` +
				(s ? ` · ${s.grams} g seed` : '')
			);
		case 'transplant':
			return (s ? `${s.plants} plants · ` : '') + `${r.rows} rows at ${r.inRowSpacingIn} in`;
		case 'harvest': {
			const who = (r.demand ?? []).map((d) => `${d.for} ${d.quantity} ${d.unit}`).join(', ');
			return `about ${r.weekQuantity} ${r.unit} this week` + (who ? ` · for ${who}` : '');
		}
	}
}

export interface MailBody {
	subject: string;
	html: string;
	text: string;
}

export function weekMail(
	sheet: WeekSheet,
	farmName: string,
	seasonName: string,
	link: string,
	sender: string
): MailBody {
	const cautions = cautionsFor(sheet.weekMeanF);
	// The week is named once: "Crew sheets 2027-W21 (Mon 24 May – Sun 30 May)", not again on each date.
	const day = (d: string): string => formatWeekDate(d).replace(/^W\d+ · /, '');
	const subject = `Crew sheets ${sheet.week} (${day(sheet.monday)} – ${day(sheet.sunday)}) · ${farmName}`;
	const html: string[] = [
		`<div style="font-family:sans-serif;color:#222;max-width:720px">`,
		`<h1 style="font-size:20px">Crew sheets for ${esc(sheet.week)}</h1>`,
		`<p>${esc(farmName)} · ${esc(seasonName)} · ${esc(formatWeekDate(sheet.monday))} to ${esc(formatWeekDate(sheet.sunday))}. Sent by ${esc(sender)}.</p>`,
		`<p>The full sheets, with columns for the actual dates and notes, are in the attached workbook. <a href="${esc(link)}">Open the sheets in Furrowcast</a>.</p>`
	];
	const text: string[] = [
		`Crew sheets for ${sheet.week}`,
		`${farmName} · ${seasonName} · ${formatWeekDate(sheet.monday)} to ${formatWeekDate(sheet.sunday)}. Sent by ${sender}.`,
		`Open the sheets: ${link}`,
		''
	];
	for (const section of sheet.sections) {
		html.push(`<h2 style="font-size:16px;margin-top:18px">${esc(section.title)} (${section.count})</h2>`);
		text.push(`${section.title.toUpperCase()} (${section.count})`);
		if (section.count === 0) {
			html.push('<p>Nothing this week.</p>');
			text.push('  Nothing this week.', '');
			continue;
		}
		html.push('<ul>');
		for (const g of section.groups) {
			for (const r of g.rows) {
				html.push(
					`<li>☐ <strong>${esc(r.crop)}</strong> · ${esc(r.variety)} — ${esc(place(r))} — ${esc(formatWeekDate(r.date))} — ${esc(detail(section.kind, r))}</li>`
				);
				text.push(
					`  [ ] ${r.crop} · ${r.variety} — ${place(r)} — ${formatWeekDate(r.date)} — ${detail(section.kind, r)}`
				);
			}
		}
		html.push('</ul>');
		for (const c of cautions[section.kind]) {
			html.push(`<p style="font-size:13px;border-left:3px solid #444;padding-left:8px">${esc(c)}</p>`);
			text.push(`  Caution: ${c}`);
		}
		text.push('');
	}
	html.push('</div>');
	return { subject, html: html.join('\n'), text: text.join('\n') };
}
