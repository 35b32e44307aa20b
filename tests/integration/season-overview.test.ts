// The season overview answers what matters now: this week's work (or the next week with some),
// crops running short from this week on (the same shortfalls as the forecast API), plantings
// without a bed, and the plan's warnings; every planting stays one click away.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { html } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let farm: NewFarm;
let seasonId: number;
beforeAll(async () => {
	farm = await signUpFarm('overview');
	({ seasonId } = await writeHandPlan(farm.farmId));
	// P2 (carrot from 50 ft) taken off its bed.
	await testDb()('plantings').where({ season_id: seasonId, start_ft: 50 }).update({ bed_id: null });
});

const page = async (): Promise<string> =>
	(await html(await farm.client.get(`/seasons/${seasonId}`))).replace(/\s+/g, ' ');

describe('the season overview', () => {
	it("names this week's work, or the next week with some", async () => {
		const text = await page();
		const today = new Date().toISOString().slice(0, 10);
		// Before the season: its first week (2026-W53, 1 Jan 2027 is a Friday) has nothing; the first
		// work is the lettuce tray sowing on Mon 15 Mar 2027, ISO 2027-W11 (ISO 8601; 4 Jan is W01's Monday).
		if (today < '2027-01-01') {
			expect(text).toContain('Work in 2027-W11');
			expect(text).toContain('Nothing in 2026-W53; this is the next week with work.');
			expect(text).toContain('1 planting for tray sowing');
			expect(text).toContain(`href="/seasons/${seasonId}/week/2027-W11"`);
		} else expect(text).toMatch(/Work in \d{4}-W\d{2}/);
	});

	it('lists the crops the forecast shows short from this week on, and no others', async () => {
		const api = await (await farm.client.get(`/api/seasons/${seasonId}/forecast`)).json();
		const crops = new Map<string, string>(api.crops.map((c: { id: string; name: string }) => [c.id, c.name]));
		const short = new Set<string>(
			api.rows
				.filter((r: { week: string; shortfall: number }) => r.week >= api.currentWeek && r.shortfall > 1e-9)
				.map((r: { crop: string }) => crops.get(r.crop))
		);
		const text = await page();
		const section = text.slice(text.indexOf('Running short'), text.indexOf('Without a bed'));
		for (const name of crops.values()) {
			if (short.has(name)) expect(section, name).toContain(`<strong>${name}</strong>`);
			else expect(section, name).not.toContain(`<strong>${name}</strong>`);
		}
		if (!short.size) expect(section).toContain('Every crop meets its demand');
	});

	it('lists the planting without a bed (not the failed one), linked to its row in the grid', async () => {
		const p2 = await testDb()('plantings').where({ season_id: seasonId, start_ft: 50 }).first('id');
		const text = await page();
		const section = text.slice(text.indexOf('Without a bed'), text.indexOf('Warnings'));
		expect(section).toContain(`href="/seasons/${seasonId}/plantings?planting=${p2.id}"`);
		expect(section).toContain('Carrot · Test Amber');
		// P4, the failed lettuce, has no bed either, but nobody needs to find it one.
		expect(section).not.toContain('Head lettuce');
		expect(text).toContain('Every planting (4)');
	});
});
