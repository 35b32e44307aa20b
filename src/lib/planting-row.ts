// A proposed planting as a row of the plantings table. Shared by the server's plan apply and the
// demo seed (which runs outside SvelteKit), so both write a plan the same way.
import type { ProposedPlanting } from '$lib/planning';

export interface PlantingRowIds {
	farmId: number;
	seasonId: number;
	varietyId: number;
	bedId: number | null;
	updatedBy?: string | null;
}

export function plantingRow(p: ProposedPlanting, ids: PlantingRowIds): Record<string, unknown> {
	return {
		farm_id: ids.farmId,
		season_id: ids.seasonId,
		variety_id: ids.varietyId,
		bed_id: ids.bedId,
		start_ft: p.startFt,
		length_ft: p.lengthFt,
		rows: p.rows,
		in_row_spacing_in: p.inRowSpacingIn,
		seeds_per_spot: p.seedsPerSpot,
		method: p.method,
		tray_sow_date: p.traySowDate,
		field_date: p.fieldDate,
		first_harvest: p.firstHarvest,
		last_harvest: p.lastHarvest,
		expected_yield: p.expectedYield,
		seeds_needed: p.seed.seeds,
		status: 'planned',
		// A planting the engine could not place keeps its reason where the grower will see it.
		notes: p.unplacedReason === null ? null : `Not placed: ${p.unplacedReason}`,
		updated_by: ids.updatedBy ?? null
	};
}
