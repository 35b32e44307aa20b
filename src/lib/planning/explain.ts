import { daysBetween, formatWeekDate } from './iso-week';
import { type SeedNeedInput, seedNeed, spotsPerRow } from './seed';
import type { Succession } from './successions';
import type { ExplainStep, Variety } from './types';

/** How seed, cells and trays were reached (DESIGN step 5). */
export function explainSeed(input: SeedNeedInput): ExplainStep[] {
	const r = seedNeed(input);
	const perRow = spotsPerRow(input.bedFeet, input.inRowSpacingIn);
	const raw = (input.bedFeet * 12) / input.inRowSpacingIn;
	const pct = (x: number): string => `${Math.round(x * 1000) / 10} %`;
	const steps: ExplainStep[] = [
		{
			label: 'spots per row',
			value: perRow,
			unit: 'spots',
			formula: `floor(${input.bedFeet} ft × 12 in ÷ ${input.inRowSpacingIn} in = ${Number(raw.toFixed(3))}) — whole spots only`
		},
		{ label: 'spots', value: r.spots, unit: 'spots', formula: `${perRow} × ${input.rows} rows` }
	];
	if (input.method === 'direct') {
		steps.push({
			label: 'seeds',
			value: r.seeds,
			unit: 'seeds',
			formula: `ceil(${r.spots} spots × ${input.seedsPerSpot} per spot ÷ ${pct(input.germinationRate)} germination × (1 + ${pct(input.margin)} margin))`
		});
	} else {
		steps.push(
			{ label: 'plants', value: r.spots, unit: 'plants', formula: 'one plant per spot' },
			{
				label: 'cells',
				value: r.cells,
				unit: 'cells',
				formula: `ceil(${r.spots} plants ÷ ${pct(input.germinationRate)} germination × (1 + ${pct(input.margin)} margin))`
			},
			{
				label: 'trays',
				value: r.trays,
				unit: 'trays',
				formula: `ceil(${r.cells} cells ÷ ${input.cellsPerTray} per tray)`
			},
			{ label: 'seeds', value: r.seeds, unit: 'seeds', formula: `${r.cells} cells × ${input.seedsPerSpot} per cell` }
		);
	}
	steps.push({
		label: 'seed weight',
		value: r.grams,
		unit: 'g',
		formula: `${r.seeds} seeds ÷ ${input.seedsPerGram} per g, rounded up to 0.01 g`
	});
	if (r.packets !== undefined)
		steps.push({
			label: 'packets',
			value: r.packets,
			unit: 'packets',
			formula: `ceil(${r.seeds} ÷ ${input.seedsPerPacket} seeds per packet)`
		});
	if (r.costCents !== undefined)
		steps.push({
			label: 'seed cost',
			value: r.costCents,
			unit: '¢',
			formula: `${r.grams} g × ${input.seedPriceCentsPerGram} ¢/g`
		});
	return steps;
}

/** How a succession's dates were worked backwards from its first harvest (DESIGN step 3). */
export function explainDates(s: Succession): ExplainStep[] {
	const d = s.basis.dtm;
	const steps: ExplainStep[] = [
		{ label: 'first harvest', value: formatWeekDate(s.firstHarvest), formula: `Monday of ${s.weeks[0]}` }
	];
	if (d.source === 'gdd' && d.gdd) {
		steps.push({
			label: 'days to maturity (degree days)',
			value: d.days,
			unit: 'days',
			formula: `days walked back until Σ max(0, weekly mean − ${d.gdd.baseF} °F) = ${d.gdd.accumulated.toFixed(1)} ≥ ${d.gdd.required}`
		});
	} else {
		steps.push({ label: 'days to maturity (variety)', value: d.varietyDays, unit: 'days' });
		steps.push({
			label: 'day length at first harvest',
			value: Number(d.dayLengthHours.toFixed(2)),
			unit: 'h',
			formula: `CBM model (Forsythe et al. 1995); threshold ${d.thresholdHours} h`
		});
		if (d.source === 'short_day') {
			steps.push({
				label: 'short-day allowance',
				value: d.allowanceDays,
				unit: 'days',
				formula: `day length under ${d.thresholdHours} h at maturity`
			});
		}
		steps.push({ label: 'effective days to maturity', value: d.days, unit: 'days' });
	}
	steps.push({
		label: s.method === 'direct' ? 'sowing date' : 'transplant date',
		value: formatWeekDate(s.fieldDate),
		formula: `first harvest − ${d.days} days`
	});
	if (s.traySowDate !== undefined) {
		const trayDays = daysBetween(s.traySowDate, s.fieldDate);
		steps.push({
			label: 'tray sowing',
			value: formatWeekDate(s.traySowDate),
			formula: `transplant date − ${trayDays} days in tray`
		});
	}
	steps.push({
		label: 'last harvest',
		value: formatWeekDate(s.lastHarvest),
		formula: `first harvest + ${s.harvestWindowDays} − 1 days`
	});
	return steps;
}

/** How a succession's bed-feet were reached (DESIGN steps 1–2). */
export function explainBedFeet(s: Succession): ExplainStep[] {
	const b = s.basis;
	const steps: ExplainStep[] = [
		{
			label: 'weekly yield per bed-foot',
			value: Number(b.weeklyYieldPerFt.toFixed(4)),
			formula: `${s.yieldPerBedFoot} per ft over the window ÷ (${s.harvestWindowDays} days ÷ 7)`
		},
		{ label: `peak target (${b.peakWeek})`, value: b.peakQuantity, formula: `largest need among ${s.weeks.join(', ')}` }
	];
	if (b.peakWeekDays < 7) {
		steps.push({
			label: 'supply per bed-foot that week',
			value: Number(b.peakSupplyPerFt.toFixed(4)),
			formula: `window covers only ${b.peakWeekDays} days of the week`
		});
	}
	steps.push(
		{
			label: 'bed-feet before rounding',
			value: Number(b.rawFeet.toFixed(3)),
			unit: 'ft',
			formula: `${b.peakQuantity} ÷ ${Number(b.peakSupplyPerFt.toFixed(4))} per ft × (1 + ${b.margin} margin)`
		},
		{ label: 'bed-feet', value: s.bedFeet, unit: 'ft', formula: `rounded up to a multiple of ${b.increment} ft` },
		{
			label: 'weekly yield',
			value: Number(s.weeklyYield.toFixed(3)),
			formula: `${s.bedFeet} ft × ${Number(b.weeklyYieldPerFt.toFixed(4))} per ft per week`
		}
	);
	return steps;
}

/** Everything about one succession: bed-feet, dates, seed. */
export function explainPlanting(s: Succession, variety: Variety): ExplainStep[] {
	return [
		...explainBedFeet(s),
		...explainDates(s),
		...explainSeed({
			method: variety.method,
			bedFeet: s.bedFeet,
			rows: variety.rows,
			inRowSpacingIn: variety.inRowSpacingIn,
			seedsPerSpot: variety.seedsPerSpot,
			germinationRate: variety.germinationRate,
			seedsPerGram: variety.seedsPerGram,
			margin: s.basis.seedMargin,
			cellsPerTray: variety.cellsPerTray,
			seedPriceCentsPerGram: variety.seedPriceCentsPerGram,
			seedsPerPacket: variety.seedsPerPacket
		})
	];
}
