// The units a library form of this farm is typed in: its unit system and currency, and the crop's
// harvest unit (yield and price are per harvest unit).
import type { UnitContext } from '$lib/schemas/crop-units';
import { harvestUnits } from '$lib/schemas/demand';
import { displayPrefs } from './farms';

export async function libraryUnits(farmId: number, harvestUnit: string | undefined): Promise<UnitContext> {
	const prefs = await displayPrefs(farmId);
	const unit = (harvestUnits as readonly string[]).includes(harvestUnit ?? '') ? harvestUnit! : 'lb';
	return { system: prefs.unitSystem, currency: prefs.currency, harvestUnit: unit };
}
