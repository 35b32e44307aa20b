// The planting grid on a metric farm: lengths show in metres and spacing in centimetres, what is
// typed or pasted in them is kept in feet and inches, and the explain panel speaks the same units.
// Source: NIST Handbook 44, Appendix C (1 ft = 0.3048 m, 1 in = 2.54 cm, 1 lb = 0.453 592 37 kg).
import { describe, expect, it } from 'vitest';
import { columnById, readCell, type Lookups } from '../../src/lib/components/grid/columns';
import { rowFromView } from '../../src/lib/components/grid/rows';
import { explainInFarmUnits } from '../../src/lib/components/grid/explain-units';
import { deriveRow, type GridFarm, type GridVariety } from '../../src/lib/plantings/derive';
import type { PlantingView } from '../../src/lib/types';
import { carrot as baseCarrot, planting } from '../helpers/grid-fixture';

// One seed a spot, so the seed steps read simply.
const carrot: GridVariety = { ...baseCarrot, seedsPerSpot: 1 };
const farm: GridFarm = {
	lastSpringFrost: '2026-05-10',
	firstFallFrost: '2026-10-05',
	latitude: 42,
	turnaroundDays: 7,
	bedFootIncrement: 1
};
const view: PlantingView = planting(1, {
	startFt: 10,
	lengthFt: 30,
	seedsPerSpot: 1,
	expectedYield: 45,
	seedsNeeded: 0
});

const lookups = (units: 'metric' | 'imperial'): Lookups => ({
	varieties: [carrot],
	varietyById: new Map([[1, carrot]]),
	beds: [{ id: 10, name: 'B1', blockId: 1, blockName: 'North', lengthFt: 100 }],
	bedById: new Map([[10, { id: 10, name: 'B1', blockId: 1, blockName: 'North', lengthFt: 100 }]]),
	units
});
const row = rowFromView(view, new Map([[1, carrot]]), farm);
const col = (id: string) => columnById.get(id)!;

describe('the grid on a metric farm', () => {
	it('shows lengths in metres and spacing in centimetres', () => {
		// 30 ft × 0.3048 = 9.144 m → 9.14; 10 ft = 3.048 m → 3.05; 1 in = 2.54 cm.
		expect(col('lengthFt').show(row, lookups('metric'))).toBe('9.14 m');
		expect(col('startFt').show(row, lookups('metric'))).toBe('3.05 m');
		expect(col('spacing').show(row, lookups('metric'))).toBe('2.54 cm');
		expect(col('lengthFt').show(row, lookups('imperial'))).toBe('30 ft');
	});

	it('keeps a typed or pasted metre and centimetre figure in feet and inches', () => {
		// 9.144 m ÷ 0.3048 = 30 ft; "3.048 m" pasted with its unit = 10 ft; 5.08 cm ÷ 2.54 = 2 in.
		expect(readCell(col('lengthFt'), '9.144', row, lookups('metric'))).toMatchObject({ ok: true, value: 30 });
		expect(readCell(col('lengthFt'), '3.048 m', row, lookups('metric'))).toMatchObject({ ok: true, value: 10 });
		expect(readCell(col('spacing'), '5.08', row, lookups('metric'))).toMatchObject({ ok: true, value: 2 });
		// An imperial farm types feet as before.
		expect(readCell(col('lengthFt'), '25', row, lookups('imperial'))).toMatchObject({ ok: true, value: 25 });
	});

	it('explains expected yield in kg per bed-metre', () => {
		const d = deriveRow(row.values, carrot, farm, true);
		if (!d.ok) throw new Error(d.message);
		const steps = explainInFarmUnits(d.value.explain, carrot, row.values, 'metric');
		const y = steps.find((s) => s.label === 'expected yield')!;
		// 30 ft × 1.5 lb/ft = 45 lb = 20.41 kg; 1.5 lb/ft = 1.5 × 0.45359237 ÷ 0.3048 = 2.23 kg/m.
		expect(y.value).toBeCloseTo(20.41, 2);
		expect(y.unit).toBe('kg');
		expect(y.formula).toBe('9.14 m × 2.23 per bed-metre over the window');
		const seedWeight = steps.find((s) => s.label === 'seed weight')!;
		expect(seedWeight.unit).toBe('g');
		const imperial = explainInFarmUnits(d.value.explain, carrot, row.values, 'imperial');
		// Seed in ounces on an imperial farm: 776.03 seeds/g × 28.349523125 = 22,000.080 seeds/oz.
		expect(imperial.find((s) => s.label === 'seed weight')!.formula).toContain('22,000.08 per oz');
		// The yields name the crop's harvest unit in either system: 30 ft × 1.5 lb/ft = 45 lb.
		expect(imperial.find((s) => s.label === 'expected yield')).toMatchObject({ value: 45, unit: 'lb' });
	});
});
