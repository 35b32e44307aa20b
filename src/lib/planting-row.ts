// A proposed planting as a row of the plantings table. Shared by the server's plan apply and the
// demo seed (which runs outside SvelteKit), so both write a plan the same way. Built from the field
// table: a field the proposal does not give takes its initial value, as a new grid row does.
import type { ProposedPlanting } from '$lib/planning';
import { figuresOf, initialValue, plantingFieldNames, toStored, type StoredPlanting } from '$lib/plantings/fields';

export interface PlantingRowIds {
	farmId: number;
	seasonId: number;
	varietyId: number;
	bedId: number | null;
	updatedBy?: string | null;
}

export function plantingRow(p: ProposedPlanting, ids: PlantingRowIds): Record<string, unknown> {
	const given = p as unknown as Record<string, unknown>;
	const values: Record<string, unknown> = {};
	for (const f of plantingFieldNames) values[f] = f in given ? given[f] : initialValue(f, undefined);
	Object.assign(values, {
		varietyId: ids.varietyId,
		bedId: ids.bedId,
		// A planting the engine could not place keeps its reason where the grower will see it.
		notes: p.unplacedReason === null ? null : `Not placed: ${p.unplacedReason}`
	});
	return {
		...toStored({ ...(values as unknown as StoredPlanting), ...figuresOf(p) }),
		farm_id: ids.farmId,
		season_id: ids.seasonId,
		updated_by: ids.updatedBy ?? null
	};
}
