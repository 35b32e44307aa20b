// The Seed order page and its CSV: per variety, the seed of every planting summed, grams rounded
// up once, whole packets, and cost = grams × price per gram; the same lines as the workbook's
// Seed order sheet. Checked by hand on the small invented plan (tests/helpers/transfer.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { html } from '../helpers/http';
import { closeTestDb } from '../helpers/db';
import { download, loadWorkbook, signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let farm: NewFarm;
let seasonId: number;
beforeAll(async () => {
	farm = await signUpFarm('seed-order');
	({ seasonId } = await writeHandPlan(farm.farmId));
});

// Source: arithmetic by hand from the hand plan's figures (germination, margin and spacing as listed
// there). Carrot "Test Amber": 3,680 + 1,840 seeds = 5,520; 5,520 ÷ 800 seeds/g = 6.9 g; 5,520 ÷ 1,500
// a packet = 3.68 → 4 packets; 6.9 g × 90 ¢ = $6.21. Head lettuce "Test Butter": 154 + 77 seeds = 231;
// 231 ÷ 800 = 0.28875 g, rounded up once to 0.29 g; 1 packet of 1,000; 0.29 g × 250 ¢ = 72.5 ¢ → $0.73.
// Rounding seed up, never short: common practice (no published source).
const carrot = { seeds: 5520, grams: 6.9, packets: 4, cost: '6.21' };
const lettuce = { seeds: 231, grams: 0.29, packets: 1, cost: '0.73' };
// The test farm is imperial: its files give seed in ounces. Source: NIST Handbook 44, Appendix C:
// 1 oz = 28.349 523 125 g. 6.9 g = 0.2434 oz; 0.29 g = 0.0102 oz (the CSV keeps four decimals).
const G_PER_OZ = 28.349523125;
const ounces = (g: number): number => Math.round((g / G_PER_OZ) * 1e4) / 1e4;

describe('the seed order', () => {
	it('the page lists each variety with seeds, grams, packets and cost, and the totals', async () => {
		const res = await farm.client.get(`/seasons/${seasonId}/seeds`);
		expect(res.status).toBe(200);
		const page = (await html(res)).replace(/\s+/g, ' ');
		expect(page).toContain('5,520');
		// On the page: 0.2434 oz shows two decimals, 0.0102 oz (under a tenth) three.
		expect(page).toContain('0.24 oz');
		expect(page).toContain('4 packets of 1,500');
		expect(page).toContain('$6.21');
		expect(page).toContain('0.01 oz');
		expect(page).toContain('1 packet of 1,000');
		expect(page).toContain('$0.73');
		// Totals: 5 packets, $6.94.
		expect(page).toMatch(/Total · 2 varieties.*5 packets.*\$6\.94/);
	});

	it('the CSV says the same, in columns a spreadsheet reads, and agrees with the workbook', async () => {
		const res = await farm.client.get(`/seasons/${seasonId}/seeds/seed-order.csv`);
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
		expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="furrowcast-seed-order-2027\.csv"/);
		const text = await res.text();
		expect(text.endsWith('\r\n')).toBe(true);
		const rows = Papa.parse<Record<string, string>>(text.trim(), { header: true }).data;
		const byVariety = new Map(rows.map((r) => [r.Variety, r]));
		for (const [name, want] of [
			['Test Amber', carrot],
			['Test Butter', lettuce]
		] as const) {
			const r = byVariety.get(name)!;
			expect([Number(r.Seeds), Number(r['Seed (oz)']), Number(r.Packets), r['Cost (USD)']], name).toEqual([
				want.seeds,
				ounces(want.grams),
				want.packets,
				want.cost
			]);
		}
		// The workbook's Seed order sheet reads the same lines.
		const wb = await loadWorkbook((await download(farm.client, seasonId)).bytes);
		const ws = wb.getWorksheet('Seed order')!;
		const head = (ws.getRow(1).values as unknown[]).slice(1).map(String);
		const at = (n: number, h: string) => ws.getRow(n).getCell(head.indexOf(h) + 1).value;
		const sheet: [string, number, number, number][] = [];
		ws.eachRow((_, n) => {
			if (n > 1)
				sheet.push([
					String(at(n, 'Variety')),
					Number(at(n, 'Seeds (seeds)')),
					ounces(Number(at(n, 'Seed (oz)')) * G_PER_OZ),
					Number(at(n, 'Cost ($)'))
				]);
		});
		expect(sheet).toEqual(
			rows.map((r) => [r.Variety, Number(r.Seeds), Number(r['Seed (oz)']), Number(r['Cost (USD)'])])
		);
	});
});
