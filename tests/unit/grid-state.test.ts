// The grid's state without a browser: edits recalculate derived figures, undo/redo, fill down,
// paste validation, and the save queue's batching and 409 handling against a stand-in server.
import { describe, expect, it } from 'vitest';
import { GridState, UNDO_LIMIT } from '../../src/lib/components/grid/grid-state.svelte';
import type { ApiAnswer, GridApi } from '../../src/lib/components/grid/save-queue.svelte';
import type { GridVariety } from '../../src/lib/plantings/derive';
import { carrot, planting } from '../helpers/grid-fixture';
import type { PlantingView } from '../../src/lib/types';

const lettuce: GridVariety = {
	...carrot,
	id: 2,
	cropId: 2,
	crop: 'Lettuce',
	family: 'Asteraceae',
	harvestUnit: 'head',
	name: 'Invented Green',
	method: 'transplant',
	daysToMaturity: 30,
	daysInTray: 28,
	inRowSpacingIn: 12,
	rows: 3,
	seedsPerSpot: 1,
	germinationRate: 0.9
};

class FakeApi implements GridApi {
	calls: { kind: string; id?: number; body: unknown }[] = [];
	answer: (kind: string, id: number | undefined, body: unknown) => ApiAnswer = (kind, id, body) =>
		kind === 'create'
			? {
					status: 201,
					body: {
						plantings: (body as Record<string, unknown>[]).map((b, i) => planting(100 + i, b as Partial<PlantingView>))
					}
				}
			: kind === 'remove'
				? { status: 204, body: null }
				: {
						status: 200,
						body: {
							planting: planting(id!, { ...(body as object), version: (body as { version: number }).version + 1 })
						}
					};
	async patch(id: number, body: Record<string, unknown>): Promise<ApiAnswer> {
		this.calls.push({ kind: 'patch', id, body });
		return this.answer('patch', id, body);
	}
	async create(_s: number, rows: Record<string, unknown>[]): Promise<ApiAnswer> {
		this.calls.push({ kind: 'create', body: rows });
		return this.answer('create', undefined, rows);
	}
	async remove(id: number): Promise<ApiAnswer> {
		this.calls.push({ kind: 'remove', id, body: null });
		return this.answer('remove', id, null);
	}
}

function grid(
	plantings = [planting(1), planting(2, { startFt: 60, lengthFt: 40, fieldDate: '2026-05-04' })],
	role: 'owner' | 'crew_lead' | 'share_manager' = 'owner',
	dateLocale?: string
) {
	const api = new FakeApi();
	const g = new GridState(
		{
			plantings,
			varieties: [carrot, lettuce],
			beds: [{ id: 10, name: 'B1', blockId: 1, blockName: 'North', lengthFt: 100 }],
			farm: {
				lastSpringFrost: '2026-05-10',
				firstFallFrost: '2026-10-05',
				latitude: 42,
				turnaroundDays: 7,
				bedFootIncrement: 5
			},
			role,
			seasonId: 1,
			dateLocale
		},
		api,
		{ debounceMs: 60_000 }
	);
	return { g, api };
}
const col = (g: GridState, id: string): number => g.columns.findIndex((c) => c.id === id);

describe('editing a cell', () => {
	it('recalculates first harvest and seeds from the new field date and bed-feet', () => {
		const { g } = grid();
		// 2026-04-20 + 70 days = 2026-06-29 (day length at 42° N in late June is far above 10 h: no allowance).
		expect(g.rows[0].derived?.firstHarvest).toBe('2026-06-29');
		// Seeds: 60 ft × 12 ÷ 1 in = 720 spots × 4 rows = 2,880; × 2 ÷ 0.65 × 1.1 = 9,747.7 → 9,748 (worked example in DEVELOPERS.md).
		expect(g.rows[0].derived?.seed.seeds).toBe(9748);
		g.moveTo(0, col(g, 'lengthFt'));
		g.beginEdit('30');
		expect(g.commitEdit()).toBe(true);
		// 30 ft: 360 spots × 4 = 1,440; × 2 ÷ 0.65 × 1.1 = 4,873.8 → 4,874.
		expect(g.rows[0].derived?.seed.seeds).toBe(4874);
		g.moveTo(0, col(g, 'fieldDate'));
		g.beginEdit('2026-05-01');
		g.commitEdit();
		// 2026-05-01 + 70 days = 2026-07-10; last harvest + 14 − 1 = 2026-07-23.
		expect(g.rows[0].derived?.firstHarvest).toBe('2026-07-10');
		expect(g.rows[0].derived?.lastHarvest).toBe('2026-07-23');
	});
	it('an edit gives the view a new item for the edited row only, and filters still apply after', () => {
		const { g } = grid([
			planting(1),
			planting(2, { startFt: 60, lengthFt: 40 }),
			planting(3, {
				varietyId: 2,
				variety: 'Invented Green',
				crop: 'Lettuce',
				method: 'transplant',
				startFt: 0,
				lengthFt: 30,
				bedId: null,
				bed: null
			})
		]);
		const before = g.view.items;
		g.moveTo(1, col(g, 'lengthFt'));
		g.beginEdit('35');
		expect(g.commitEdit()).toBe(true);
		const after = g.view.items;
		expect(after).toHaveLength(3);
		// Rows 0 and 2 keep their item objects (so their cells are not drawn again); row 1 has a new one.
		expect(after[0]).toBe(before[0]);
		expect(after[2]).toBe(before[2]);
		expect(after[1]).not.toBe(before[1]);
		expect(after[1]).toMatchObject({ kind: 'row', index: 1 });
		expect(after[1].kind === 'row' && after[1].row.values.lengthFt).toBe(35);
		// A filter after the patched view, then none again: the full list comes back, edit included.
		g.filters.crop = 'Lettuce';
		expect(g.view.rows.map((r) => r.key)).toEqual([g.rows[2].key]);
		g.filters.crop = '';
		expect(g.view.rows.map((r) => r.values.lengthFt)).toEqual([60, 35, 30]);
	});

	it("keeps an invalid entry in its cell with the schema's message, changing nothing", () => {
		const { g } = grid();
		g.moveTo(0, col(g, 'rows'));
		g.beginEdit('2.5');
		expect(g.commitEdit()).toBe(false);
		expect(g.rows[0].errors.rows?.message).toBe('Rows must be a whole number.');
		expect(g.rows[0].values.rows).toBe(4);
	});
	it('marks the overlap when two plantings share bed-feet and dates', () => {
		const { g } = grid();
		expect(g.rows[1].conflicts).toEqual([]);
		g.moveTo(1, col(g, 'startFt'));
		g.beginEdit('30');
		g.commitEdit();
		expect(g.rows[0].conflicts.map((c) => c.code)).toContain('overlap');
		expect(g.rows[1].conflicts.map((c) => c.code)).toContain('overlap');
	});
	it('refuses a crew lead the crop and bed-feet but lets them set the status', () => {
		const { g } = grid(undefined, 'crew_lead');
		g.moveTo(0, col(g, 'lengthFt'));
		expect(g.beginEdit('5')).toBe(false);
		g.moveTo(0, col(g, 'status'));
		expect(g.beginEdit('sown')).toBe(true);
		expect(g.commitEdit()).toBe(true);
		expect(g.rows[0].values.status).toBe('sown');
	});
});

describe('undo, redo and fill down', () => {
	it('keeps at least 100 steps and walks them back in order', () => {
		const { g } = grid();
		g.moveTo(0, col(g, 'startFt'));
		for (let i = 1; i <= 120; i++) {
			g.beginEdit(String(i));
			g.commitEdit();
		}
		expect(UNDO_LIMIT).toBeGreaterThanOrEqual(100);
		for (let i = 0; i < 100; i++) g.undo();
		expect(g.rows[0].values.startFt).toBe(20);
		g.redo();
		expect(g.rows[0].values.startFt).toBe(21);
	});
	it("fills the top row's bed-feet into the rows below", () => {
		const { g } = grid([planting(1), planting(2, { lengthFt: 20 }), planting(3, { lengthFt: 25 })]);
		g.moveTo(0, col(g, 'lengthFt'));
		g.moveTo(2, col(g, 'lengthFt'), true);
		g.fillDown();
		expect(g.rows.map((r) => r.values.lengthFt)).toEqual([60, 60, 60]);
		g.undo();
		expect(g.rows.map((r) => r.values.lengthFt)).toEqual([60, 20, 25]);
	});
});

describe('paste', () => {
	it('names each bad cell by row and column and saves the good ones only when confirmed', () => {
		const { g } = grid();
		g.moveTo(0, col(g, 'startFt'));
		const p = g.paste('5\t40\n7\tlots\n');
		expect(p.bad).toEqual([{ row: 2, column: 'Bed-feet', text: 'lots', message: 'Bed-feet must be a number.' }]);
		expect(g.rows[0].values.startFt).toBe(0);
		g.confirmPaste();
		expect(g.rows[0].values.startFt).toBe(5);
		expect(g.rows[0].values.lengthFt).toBe(40);
		expect(g.rows[1].values.startFt).toBe(7);
		expect(g.rows[1].values.lengthFt).toBe(40);
	});
	it('turns rows past the end into new rows, sent in one POST', async () => {
		const { g, api } = grid();
		g.moveTo(1, col(g, 'crop'));
		g.paste('Carrot\nLettuce\nLettuce');
		expect(g.rows).toHaveLength(4);
		expect(g.rows[3].values.method).toBe('transplant');
		await g.save.flush();
		expect(api.calls.filter((c) => c.kind === 'create')).toHaveLength(1);
		expect((api.calls.find((c) => c.kind === 'create')!.body as unknown[]).length).toBe(2);
		expect(g.rows[3].id).toBe(101);
	});

	it('reads dates the way the locale writes them, and says which when day and month could swap', () => {
		// Source: the order comes from Intl.DateTimeFormat (CLDR): en-US writes month/day/year, en-GB day/month/year.
		const { g } = grid();
		g.lookups.locale = 'en-US';
		g.moveTo(0, col(g, 'fieldDate'));
		expect(g.paste('6/24/2026').bad).toEqual([]);
		expect(g.rows[0].values.fieldDate).toBe('2026-06-24');
		const p = g.paste('6/7/2026');
		expect(p.notes).toEqual([
			expect.objectContaining({
				row: 1,
				column: 'Field date',
				message: expect.stringMatching(/read as 7 June 2026 \(month\/day\/year, as en-US/)
			})
		]);
		// Nothing is saved until the reading is confirmed.
		expect(g.rows[0].values.fieldDate).toBe('2026-06-24');
		g.confirmPaste();
		expect(g.rows[0].values.fieldDate).toBe('2026-06-07');
		g.lookups.locale = 'en-GB';
		expect(g.paste('24/06/2026').bad).toEqual([]);
		expect(g.rows[0].values.fieldDate).toBe('2026-06-24');
		expect(g.paste('6/24/2026').bad[0].message).toMatch(/not a real date when read as day\/month\/year/);
	});
	it("reads pasted dates the farm's way (its date style), not the browser's", () => {
		// Source: Intl.DateTimeFormat (CLDR): de-DE writes day.month.year.
		const { g } = grid([planting(1)], 'owner', 'de-DE');
		g.moveTo(0, col(g, 'fieldDate'));
		expect(g.paste('24.6.2026').bad).toEqual([]);
		expect(g.rows[0].values.fieldDate).toBe('2026-06-24');
	});
	it("a new row's bad bed stays empty and a bad date leaves the row out: never the previous row's values", () => {
		const { g } = grid();
		// The last row is in bed B1: the pasted row below it must not take that bed.
		g.moveTo(1, col(g, 'bed'));
		const p = g.paste('B1\nZ9\n');
		expect(p.bad).toEqual([expect.objectContaining({ row: 3, column: 'Bed', text: 'Z9' })]);
		g.confirmPaste();
		expect(g.rows).toHaveLength(3);
		expect(g.rows[2].values.bedId).toBeNull();
		g.moveTo(2, col(g, 'fieldDate'));
		const q = g.paste('2026-05-01\n31/31/2026');
		expect(q.bad.map((b) => b.column)).toEqual(['Field date', '—']);
		g.confirmPaste();
		expect(g.rows).toHaveLength(3);
	});
});

describe('the save queue', () => {
	it('sends only the changed fields with the version, and takes the new version', async () => {
		const { g, api } = grid();
		g.moveTo(0, col(g, 'notes'));
		g.beginEdit('thin at 2 in');
		g.commitEdit();
		expect(g.save.unsaved).toBe(true);
		await g.save.flush();
		expect(api.calls).toEqual([{ kind: 'patch', id: 1, body: { version: 1, notes: 'thin at 2 in' } }]);
		expect(g.rows[0].version).toBe(2);
		expect(g.save.status).toBe('saved');
	});
	it("on 409 shows whose change won and keeps the user's edit to re-apply", async () => {
		const { g, api } = grid();
		api.answer = (kind, id, body) =>
			kind === 'patch' && (body as { version: number }).version === 1
				? {
						status: 409,
						body: {
							message: 'Pat saved first',
							changedBy: 'Pat',
							current: planting(1, { version: 2, notes: 'theirs', updatedBy: 'Pat' })
						}
					}
				: { status: 200, body: { planting: planting(id!, { ...(body as object), version: 3 }) } };
		g.moveTo(0, col(g, 'notes'));
		g.beginEdit('mine');
		g.commitEdit();
		await g.save.flush();
		expect(g.save.status).toBe('failed');
		expect(g.save.conflicts[0].changedBy).toBe('Pat');
		expect(g.save.conflicts[0].mine).toEqual({ notes: 'mine' });
		expect(g.rows[0].values.notes).toBe('theirs');
		g.save.reapply(g.rows[0].key);
		await g.save.flush();
		expect(api.calls.at(-1)).toEqual({ kind: 'patch', id: 1, body: { version: 2, notes: 'mine' } });
		expect(g.rows[0].values.notes).toBe('mine');
		expect(g.save.status).toBe('saved');
	});
	it('keeps a failed save queued and sends it again on retry', async () => {
		const { g, api } = grid();
		api.answer = () => ({ status: 503, body: { message: 'down' } });
		g.moveTo(0, col(g, 'notes'));
		g.beginEdit('x');
		g.commitEdit();
		await g.save.flush();
		expect(g.save.status).toBe('failed');
		expect(g.save.pending).toBe(1);
		api.answer = (_k, id, body) => ({
			status: 200,
			body: { planting: planting(id!, { ...(body as object), version: 2 }) }
		});
		await g.save.retry();
		expect(g.save.status).toBe('saved');
		expect(api.calls).toHaveLength(2);
	});
	it('removes a row with DELETE and undo sends it back as a new row', async () => {
		const { g, api } = grid();
		g.moveTo(0, 0);
		g.removeSelected();
		await g.save.flush();
		expect(api.calls[0]).toEqual({ kind: 'remove', id: 1, body: null });
		g.undo();
		await g.save.flush();
		expect(api.calls[1].kind).toBe('create');
		expect(g.rows).toHaveLength(2);
	});
});

describe('grouping', () => {
	it('totals bed-feet, seed grams and yield per group', () => {
		const { g } = grid([
			planting(1),
			planting(2, { varietyId: 2, method: 'transplant', lengthFt: 20 }),
			planting(3, { lengthFt: 30, startFt: 60 })
		]);
		g.groupBy = 'crop';
		const groups = g.view.items.filter((i) => i.kind === 'group');
		expect(groups.map((x) => x.kind === 'group' && x.label)).toEqual(['Carrot', 'Lettuce']);
		const carrotTotals = groups[0].kind === 'group' ? groups[0].totals : null;
		// 60 ft + 30 ft; yield 60 × 1.5 + 30 × 1.5 = 135 lb.
		expect(carrotTotals?.bedFeet).toBe(90);
		expect(carrotTotals?.yield).toEqual({ lb: 135 });
	});
});
