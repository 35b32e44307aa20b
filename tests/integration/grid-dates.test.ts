// The grid recalculates every planting in the browser from its field date; the server stores
// the dates its planner (or the last save) worked out. Over every planting of the invented demo
// farm the two must agree, or the grid shows one harvest and the forecast counts another.
import { afterAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { signedIn, type Client } from '../helpers/http';
import { rowFromView } from '../../src/lib/components/grid/rows';
import type { GridFarm, GridVariety } from '../../src/lib/plantings/derive';
import type { PlantingView } from '../../src/lib/types';

interface GridAnswer {
	plantings: PlantingView[];
	varieties: GridVariety[];
	farm: GridFarm;
}

async function demoSeasons(): Promise<number[]> {
	const rows = await testDb()('seasons as s')
		.join('farms as f', 'f.id', 's.farm_id')
		.where('f.name', 'like', '%(invented demo)')
		.orderBy('s.year')
		.select<{ id: number }[]>('s.id');
	return rows.map((r) => Number(r.id));
}

async function grid(owner: Client, season: number): Promise<GridAnswer> {
	const res = await owner.get(`/api/seasons/${season}/plantings`);
	expect(res.status).toBe(200);
	return (await res.json()) as GridAnswer;
}

/** Each planting's stored dates beside what the grid derives for it, where they differ. */
function mismatches(answer: GridAnswer): string[] {
	const varieties = new Map(answer.varieties.map((v) => [v.id, v]));
	const out: string[] = [];
	for (const p of answer.plantings) {
		const row = rowFromView(p, varieties, answer.farm);
		const d = row.derived;
		const stored = `${p.traySowDate ?? '-'} ${p.fieldDate} ${p.firstHarvest} ${p.lastHarvest}`;
		const derived = d
			? `${d.traySowDate ?? '-'} ${p.fieldDate} ${d.firstHarvest} ${d.lastHarvest}`
			: `error ${row.deriveError}`;
		if (stored !== derived) out.push(`${p.crop} ${p.variety} #${p.id}: stored ${stored}, grid ${derived}`);
	}
	return out;
}

afterAll(closeTestDb);

describe('grid and server dates agree on the demo farm', () => {
	it('every demo planting: the grid recomputes the dates the server stored', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const seasons = await demoSeasons();
		expect(seasons.length).toBeGreaterThanOrEqual(2);
		let checked = 0;
		for (const season of seasons) {
			const answer = await grid(owner, season);
			checked += answer.plantings.length;
			expect(mismatches(answer)).toEqual([]);
		}
		// The 2026 fall plantings and the 2027 plan: a couple of hundred rows.
		expect(checked).toBeGreaterThan(100);
	});

	it('saving a note on a summer squash planting keeps its July harvest', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const seasons = await demoSeasons();
		const answer = await grid(owner, seasons[seasons.length - 1]);
		const squash = answer.plantings.find((p) => p.crop === 'Summer squash' && p.status === 'planned');
		expect(squash).toBeDefined();
		const p = squash!;
		const res = await owner.json(`/api/plantings/${p.id}`, 'PATCH', { version: p.version, notes: 'checked the dates' });
		expect(res.status).toBe(200);
		const saved = ((await res.json()) as { planting: PlantingView }).planting;
		expect([saved.fieldDate, saved.firstHarvest, saved.lastHarvest]).toEqual([
			p.fieldDate,
			p.firstHarvest,
			p.lastHarvest
		]);
		// A squash transplanted in late spring or summer is picked the same summer, never the next year.
		expect(saved.firstHarvest.slice(0, 4)).toBe(p.fieldDate.slice(0, 4));
		const back = await owner.json(`/api/plantings/${p.id}`, 'PATCH', { version: saved.version, notes: p.notes });
		expect(back.status).toBe(200);
	});
});
