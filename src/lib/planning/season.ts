/**
 * A whole season in one call: weekly targets per crop, less what kept plantings already
 * supply, become successions per variety, placed into beds around the kept plantings.
 * The server's plan preview and the demo seed both plan through here.
 */
import type { BedPlanting } from './bed-types';
import { type DayNumber, fromDayNumber, toDayNumber } from './day-number';
import { type ForecastPlanting, forecast } from './forecast';
import { keptSupply } from './kept-supply';
import { type PlacementJobs, placeJobs, preparePlacement } from './placement';
import { type SeasonFacts, successionWarnings } from './plan-warnings';
import { inPlanOrder } from './season-order';
import { planOrder } from './season-plan-order';
import type {
	KeptPlanting,
	ProposedPlanting,
	SeasonPlan,
	SeasonPlanInput,
	SeasonVariety,
	VarietyShare
} from './season-types';
import { seedNeed, type SeedNeed, type SeedNeedInput } from './seed';
import { planSuccessionRuns, withDtmWarnings } from './successions';
import type { CropWeekQuantity, PlanningWarning } from './types';
import { makeTempLookup } from './weekly-temps';

export type * from './season-types';

function weekNumber(week: string): number {
	return Number(week.slice(6));
}

export function planSeason(input: SeasonPlanInput): SeasonPlan {
	const kept = input.kept ?? [];
	// (Index loops here and below: this code runs once per plan, too seldom to be optimised,
	// and each step of a for-of loop over thousands of targets then leaves an object behind.)
	const varietyById = new Map<string, SeasonVariety>();
	const byCrop = new Map<string, SeasonVariety[]>();
	for (let i = 0; i < input.varieties.length; i++) {
		const v = input.varieties[i];
		varietyById.set(v.id, v);
		(byCrop.get(v.cropId) ?? byCrop.set(v.cropId, []).get(v.cropId)!).push(v);
	}

	const targets = input.targets;
	const fromKept = keptSupply(kept);
	const targetsByCrop = new Map<string, CropWeekQuantity[]>();
	for (let i = 0; i < targets.length; i++) {
		const t = targets[i];
		(targetsByCrop.get(t.crop) ?? targetsByCrop.set(t.crop, []).get(t.crop)!).push(t);
	}

	const warnings: SeasonPlan['warnings'] = [];
	const shortfall: CropWeekQuantity[] = [];
	// Successions in planning order (crop by crop, share by share, succession by succession),
	// as parallel lists: placement's, and what each proposal needs besides. No object per
	// succession until the proposals at the end: everything kept alive through placement is
	// copied by the garbage collector, which at thousands of plantings made planning superlinear.
	// Each succession's key is `${prefix}#${n}`: made when asked for, not kept (a string each).
	const succPrefix: string[] = [];
	const succNumber: number[] = [];
	const keyOf = (i: number): string => `${succPrefix[i]}#${succNumber[i]}`;
	const datesOf = (i: number): { fieldDate: string; lastHarvest: string } => ({
		fieldDate: fromDayNumber(jobs.fieldDays[i]),
		lastHarvest: fromDayNumber(jobs.lastDays[i])
	});
	const jobs: PlacementJobs = { count: 0, keyOf, datesOf, bedFeet: [], fieldDays: [], lastDays: [], families: [] };
	const plannedVariety: SeasonVariety[] = [];
	// Share of its window's yield each succession picks (under 1 when its harvest ends early).
	const yieldShares: number[] = [];
	const firstDays: DayNumber[] = [];
	// Tray sowing day; -Infinity for a direct-sown planting.
	const trayDays: DayNumber[] = [];
	// Days-to-maturity warnings by succession, for the few that have any. Each succession's frost
	// and heat warnings are made with its proposal, at the end, rather than carried through placement.
	const dtmWarnings = new Map<number, PlanningWarning[]>();
	let planned = 0;
	// Key prefixes in use, so two shares never plan under the same keys, and which successions each one has.
	const prefixes = new Set<string>();
	const groups: { prefix: string; start: number; count: number }[] = [];
	// One temperature lookup for the farm, shared by every variety's planning.
	const temps = input.farm?.weeklyMeanTempF ? makeTempLookup(input.farm.weeklyMeanTempF) : undefined;

	targetsByCrop.forEach((cropTargets, cropId) => {
		const planShares = input.varietyPlan?.[cropId];
		const shares: VarietyShare[] =
			planShares ??
			byCrop
				.get(cropId)
				?.slice(0, 1)
				.map((v) => ({ varietyId: v.id })) ??
			[];
		if (shares.length === 0) {
			const message = planShares
				? 'The variety plan gives this crop no variety, so its targets cannot be planned.'
				: 'No variety of this crop is in the library, so its targets cannot be planned.';
			warnings.push({ code: 'no_variety', cropId, message, weeks: cropTargets.map((t) => t.week) });
			const k = fromKept.get(cropId);
			for (const t of cropTargets) {
				const left = t.quantity - (k?.get(t.week) ?? 0);
				if (left > 1e-9) shortfall.push({ crop: cropId, week: t.week, quantity: left });
			}
			return;
		}
		// How much of each week's target the valid shares carry; what no share carries is shortfall.
		// (A crop planned by its first variety alone, the usual case, carries all of it.)
		const carried = planShares ? new Map<string, number>() : undefined;
		let spill: Map<string, number> | undefined;
		shares.forEach((share, i) => {
			const variety = varietyById.get(share.varietyId);
			if (!variety || variety.cropId !== cropId) {
				warnings.push({
					code: 'no_variety',
					cropId,
					message: `Variety ${share.varietyId} is not a variety of this crop; its share of the targets is left unplanned.`
				});
				return;
			}
			const fraction = share.fraction ?? 1;
			let weekly: { week: string; quantity: number }[] = cropTargets;
			if (carried) {
				weekly = [];
				for (const t of cropTargets) {
					const n = weekNumber(t.week);
					if (n < (share.fromWeek ?? 1) || n > (share.toWeek ?? 53)) continue;
					weekly.push({ week: t.week, quantity: t.quantity * fraction });
					carried.set(t.week, (carried.get(t.week) ?? 0) + fraction);
				}
			}
			if (weekly.length === 0) return;
			// What already harvests in this share's weeks: its fraction of the kept plantings' supply,
			// and what the crop's earlier shares' successions harvest past their own weeks.
			const keptHere = fromKept.get(cropId);
			const supplied: { week: string; quantity: number }[] = [];
			for (const t of weekly) {
				const q = (keptHere?.get(t.week) ?? 0) * fraction + (spill?.get(t.week) ?? 0);
				if (q > 0) supplied.push({ week: t.week, quantity: q });
			}
			// A storage crop's kept harvest feeds later weeks from store: it counts whenever it is dug.
			if (variety.storage && variety.storage.keepWeeks > 0 && keptHere) {
				const inWeeks = new Set(weekly.map((t) => t.week));
				for (const [week, q] of keptHere)
					if (!inWeeks.has(week) && q > 0) supplied.push({ week, quantity: q * fraction });
			}
			// Two shares of one variety from the same week would otherwise plan under the same keys.
			let keyPrefix = `${variety.id}@w${share.fromWeek ?? 1}`;
			if (prefixes.has(keyPrefix)) keyPrefix += `.${i + 1}`;
			prefixes.add(keyPrefix);
			const start = planned;
			const mine: ForecastPlanting[] | undefined = shares.length > 1 ? [] : undefined;
			const result = planSuccessionRuns(
				{ variety, targets: weekly, supplied, farm: input.farm, options: { ...input.options, keyPrefix } },
				temps,
				(r) => {
					mine?.push({
						crop: cropId,
						firstHarvest: fromDayNumber(r.start),
						lastHarvest: fromDayNumber(r.lastHarvest),
						bedFeet: r.bedFeet,
						yieldPerBedFoot: variety.yieldPerBedFoot,
						curve: variety.harvestCurve,
						windowDays: variety.harvestWindowDays
					});
					yieldShares.push(r.yieldShare);
					succPrefix.push(keyPrefix);
					succNumber.push(r.index + 1);
					jobs.bedFeet.push(r.bedFeet);
					jobs.fieldDays.push(r.fieldDay);
					jobs.lastDays.push(r.lastHarvest);
					jobs.families.push(variety.family);
					plannedVariety.push(variety);
					firstDays.push(r.start);
					trayDays.push(r.trayDay ?? -Infinity);
					if (r.warnings.length > 0) dtmWarnings.set(planned, r.warnings);
					planned++;
				}
			);
			if (planned > start) groups.push({ prefix: keyPrefix, start, count: planned - start });
			// This share's harvest outside its own weeks feeds the shares planned after it.
			if (mine && mine.length > 0) {
				for (const r of forecast(mine, [])) {
					const n = weekNumber(r.week);
					if (n >= (share.fromWeek ?? 1) && n <= (share.toWeek ?? 53)) continue;
					spill ??= new Map();
					spill.set(r.week, (spill.get(r.week) ?? 0) + r.supply);
				}
			}
			for (const w of result.warnings) warnings.push({ ...w, cropId });
			for (const q of result.shortfall) shortfall.push({ crop: cropId, week: q.week, quantity: q.quantity });
		});
		if (!carried) return;
		const uncarried = cropTargets
			.map((t) => ({ crop: cropId, week: t.week, quantity: t.quantity * Math.max(0, 1 - (carried.get(t.week) ?? 0)) }))
			.filter((t) => t.quantity > 1e-9);
		if (uncarried.length) {
			warnings.push({
				code: 'no_variety',
				cropId,
				message: `The variety plan leaves part of the target in ${uncarried.map((t) => t.week).join(', ')} to no variety.`,
				weeks: uncarried.map((t) => t.week)
			});
			shortfall.push(...uncarried);
		}
	});

	const fixed: BedPlanting[] = kept
		.filter((k): k is KeptPlanting & { bedId: string } => k.bedId !== null)
		.map((k): BedPlanting => ({
			key: k.key,
			bedId: k.bedId,
			startFt: k.startFt,
			lengthFt: k.lengthFt,
			fieldDate: k.fieldDate,
			lastHarvest: k.lastHarvest,
			family: k.family
		}))
		.concat(input.obstacles ?? []);
	jobs.count = planned;
	const placement = placeJobs(
		preparePlacement(input.beds, {
			turnaroundDays: input.options?.turnaroundDays,
			fixed,
			previousFamilyByBed: input.previousFamilyByBed
		}),
		jobs
	);
	// Placement notes by the succession they are about; notes about kept plantings (e.g. one naming an unknown bed) belong to the season's warnings.
	// (Sized up front: writing far past the end of an empty list would turn it into a slow sparse one.)
	const notes: (PlanningWarning[] | undefined)[] = filled<PlanningWarning[] | undefined>(planned, undefined);
	placement.warnings.forEach((n, i) => {
		const from = placement.noteFrom[i];
		if (from < 0) warnings.push({ code: n.code, key: n.plantingKey, message: n.message });
		else {
			// Exact-size lists (a list grown by push keeps room for 16 more): most plantings have one note at most.
			const note = { code: n.code, message: n.message };
			const had = notes[from];
			notes[from] = had ? [...had, note] : [note];
		}
	});

	const seedMargin = input.options?.seedMargin ?? 0.1;
	// One seed input, refilled for each piece: seedNeed keeps none of it.
	const seedIn: SeedNeedInput = {
		method: 'direct',
		bedFeet: 0,
		rows: 0,
		inRowSpacingIn: 0,
		seedsPerSpot: 0,
		germinationRate: 0,
		seedsPerGram: 0,
		margin: 0
	};
	// Seed for a piece of bed: a planting split over two beds needs seed for each.
	const seedFor = (v: SeasonVariety, lengthFt: number): SeedNeed => {
		seedIn.method = v.method;
		seedIn.bedFeet = lengthFt;
		seedIn.rows = v.rows;
		seedIn.inRowSpacingIn = v.inRowSpacingIn;
		seedIn.seedsPerSpot = v.seedsPerSpot;
		seedIn.germinationRate = v.germinationRate;
		seedIn.seedsPerGram = v.seedsPerGram;
		seedIn.margin = v.margin ?? seedMargin;
		seedIn.cellsPerTray = v.cellsPerTray;
		seedIn.seedPriceCentsPerGram = v.seedPriceCentsPerGram;
		seedIn.seedsPerPacket = v.seedsPerPacket;
		return seedNeed(seedIn);
	};
	const yieldOf = (v: SeasonVariety, lengthFt: number, from: number): number =>
		Math.round(lengthFt * v.yieldPerBedFoot * yieldShares[from] * 100) / 100;
	// Most plantings carry no placement note: they keep their succession's own list rather than a copy.
	const warningsOf = (own: PlanningWarning[], from: number): PlanningWarning[] => {
		const placed = notes[from];
		return placed ? [...own, ...placed] : own;
	};

	const { placedFrom, placedBed, placedStart, placedLength, unplacedFrom } = placement;
	// Where each succession's pieces are in `placed` (they come one after another), or where it is in `unplaced`.
	const firstPiece: number[] = filled(planned, -1);
	const pieceCount: number[] = filled(planned, 0);
	let maxPieces = 1;
	for (let i = 0; i < placedFrom.length; i++) {
		const from = placedFrom[i];
		if (firstPiece[from] < 0) firstPiece[from] = i;
		if (++pieceCount[from] > maxPieces) maxPieces = pieceCount[from];
	}
	const unplacedAt: number[] = filled(planned, -1);
	for (let j = 0; j < unplacedFrom.length; j++) unplacedAt[unplacedFrom[j]] = j;

	// The frost and heat warnings of every succession, against the farm's frost dates (which
	// planning has checked by now, if there is any succession) and weekly temperatures.
	const facts: SeasonFacts | undefined =
		planned === 0
			? undefined
			: {
					lastSpringFrost: toDayNumber(input.farm.lastSpringFrost),
					firstFallFrost: toDayNumber(input.farm.firstFallFrost),
					tenderDaysAfterFrost: input.farm.tenderDaysAfterFrost,
					frostProbabilityPct: input.farm.frostProbabilityPct,
					temps
				};
	// A succession's own warnings: the days-to-maturity ones, then its frost and heat ones.
	const ownWarnings = (from: number): PlanningWarning[] => {
		const own = successionWarnings(
			plannedVariety[from],
			jobs.fieldDays[from],
			firstDays[from],
			jobs.lastDays[from],
			facts!
		);
		return withDtmWarnings(dtmWarnings.get(from) ?? [], own);
	};
	const proposal = (
		from: number,
		key: string,
		bedId: string | null,
		startFt: number,
		lengthFt: number,
		own: PlanningWarning[],
		unplacedReason: string | null
	): ProposedPlanting => {
		const v = plannedVariety[from];
		return {
			key,
			cropId: v.cropId,
			varietyId: v.id,
			bedId,
			startFt,
			lengthFt,
			rows: v.rows,
			inRowSpacingIn: v.inRowSpacingIn,
			seedsPerSpot: v.seedsPerSpot,
			method: v.method,
			traySowDate: trayDays[from] === -Infinity ? null : fromDayNumber(trayDays[from]),
			fieldDate: fromDayNumber(jobs.fieldDays[from]),
			firstHarvest: fromDayNumber(firstDays[from]),
			lastHarvest: fromDayNumber(jobs.lastDays[from]),
			expectedYield: yieldOf(v, lengthFt, from),
			harvestWindowDays: v.harvestWindowDays,
			...(v.harvestCurve && v.harvestCurve.shape !== 'flat' ? { curve: v.harvestCurve } : {}),
			seed: seedFor(v, lengthFt),
			warnings: warningsOf(own, from),
			unplacedReason
		};
	};
	// The proposals in planning order (reading the lists above in order, not at random), each
	// with its succession and piece (0: whole, k: the (k + 1)th piece of a split) for the sort.
	const count = placedFrom.length + unplacedFrom.length;
	const all: ProposedPlanting[] = new Array<ProposedPlanting>(count);
	// (Plain arrays: typed arrays each hold a buffer outside the heap, which costs the collector more at this size.)
	const fromOf: number[] = filled(count, 0);
	const pieceOf: number[] = filled(count, 0);
	let n = 0;
	for (let from = 0; from < planned; from++) {
		const first = firstPiece[from];
		const key = keyOf(from);
		const own = ownWarnings(from);
		if (first >= 0) {
			for (let k = 0; k < pieceCount[from]; k++) {
				const i = first + k;
				all[n] = proposal(
					from,
					k === 0 ? key : `${key}/${k + 1}`,
					input.beds[placedBed[i]].id,
					placedStart[i],
					placedLength[i],
					own,
					null
				);
				fromOf[n] = from;
				pieceOf[n++] = k;
			}
		} else {
			all[n] = proposal(from, key, null, 0, jobs.bedFeet[from], own, placement.unplaced[unplacedAt[from]].reason);
			fromOf[n++] = from;
		}
	}
	// Plan order; where the key ranks do not hold (a '#' in a variety id), one sort by date and key.
	const plantings = planOrder(all, fromOf, pieceOf, maxPieces, jobs.fieldDays, groups) ?? inPlanOrder(all, []);
	for (const u of placement.unplaced)
		warnings.push({ code: 'not_placed', key: u.plantingKey, message: `Not placed: ${u.reason}` });
	return { plantings, shortfall, warnings };
}

/** A list of n copies of `fill`. */
function filled<T>(n: number, fill: T): T[] {
	return new Array<T>(n).fill(fill);
}
