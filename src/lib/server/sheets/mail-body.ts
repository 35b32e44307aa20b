// The e-mail that carries a week's crew sheets: a plain HTML summary (inline styles only, as mail
// readers strip style sheets) and its text twin; the full sheets travel as the attached .xlsx.
import { plural } from '$lib/plural';
import { formatWeekDate } from '$lib/planning';
import { cautionsFor } from './cautions';
import {
	formatFeet,
	formatInches,
	formatNumber,
	formatQuantity,
	formatSeedWeight,
	toDisplayFeet,
	type UnitSystem
} from '$lib/format';
import type { SheetRow, SheetSection, WeekSheet } from './week';

function esc(s: string): string {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** "North · N01, 0–15.24 m" or "North · N01, 0–50 ft": the stretch of bed, in the farm's length unit. */
function place(r: SheetRow, system: UnitSystem): string {
	if (!r.bed) return 'not placed';
	const from = formatNumber(toDisplayFeet(r.startFt, system), 2);
	return `${r.block} · ${r.bed}, ${from}–${formatFeet(r.endFt, system, 2)}`;
}

function detail(kind: SheetSection['kind'], r: SheetRow, system: UnitSystem): string {
	const s = r.seed;
	const spacing = formatInches(r.inRowSpacingIn, system);
	switch (kind) {
		case 'tray_sow':
			return s
				? `${plural(s.cells, 'cell')} · ${plural(s.trays, 'tray')} of ${r.cellsPerTray} · ${formatSeedWeight(s.grams, system)} seed`
				: 'seed figures missing';
		case 'direct_sow':
			return (
				`${plural(r.rows, 'row')} at ${spacing} · ${plural(r.seedsPerSpot, 'seed')} per spot` +
				(s ? ` · ${formatSeedWeight(s.grams, system)} seed` : '')
			);
		case 'transplant':
			return (
				(s?.plants !== undefined ? `${plural(s.plants, 'plant')} · ` : '') + `${plural(r.rows, 'row')} at ${spacing}`
			);
		case 'harvest': {
			const who = (r.demand ?? []).map((d) => `${d.for} ${formatQuantity(d.quantity, d.unit, system)}`).join(', ');
			return (
				`about ${formatQuantity(r.weekQuantity ?? 0, r.unit ?? '', system, 1)} this week` + (who ? ` · for ${who}` : '')
			);
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
	const system = sheet.unitSystem ?? 'imperial';
	const cautions = cautionsFor(sheet.weekMeanF, system);
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
					`<li>☐ <strong>${esc(r.crop)}</strong> · ${esc(r.variety)} — ${esc(place(r, system))} — ${esc(formatWeekDate(r.date))} — ${esc(detail(section.kind, r, system))}</li>`
				);
				text.push(
					`  [ ] ${r.crop} · ${r.variety} — ${place(r, system)} — ${formatWeekDate(r.date)} — ${detail(section.kind, r, system)}`
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
