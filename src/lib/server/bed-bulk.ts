// Many beds at once ("12 beds of 100 ft, 30 in wide"), for the set-up path and the beds page.
// One transaction: every bed is added, or none when one name is already taken.
import { db } from './db';
import { BedInputError } from './beds';
import type { BulkBedsInput } from '$lib/schemas/farm';

export async function addBeds(farmId: number, input: BulkBedsInput): Promise<{ block: string; names: string[] }> {
	const names = Array.from({ length: input.count }, (_, i) => `${input.prefix}${input.firstNumber + i}`);
	return db().transaction(async (trx) => {
		let block = await trx('blocks').where({ farm_id: farmId, name: input.block }).forUpdate().first('id');
		if (!block) {
			const max = await trx('blocks').where({ farm_id: farmId }).max('position as p').first();
			const [id] = await trx('blocks').insert({
				farm_id: farmId,
				name: input.block,
				position: Number(max?.p ?? 0) + 1
			});
			block = { id };
		}
		const taken: string[] = (await trx('beds').where({ farm_id: farmId }).whereIn('name', names).select('name')).map(
			(r: { name: string }) => r.name
		);
		if (taken.length) {
			throw new BedInputError(
				'prefix',
				`${taken.length === 1 ? 'A bed' : 'Beds'} named ${taken.slice(0, 5).join(', ')}${taken.length > 5 ? ' …' : ''} already ${taken.length === 1 ? 'exists' : 'exist'}; choose another name start or first number.`
			);
		}
		const last = await trx('beds').where({ farm_id: farmId, block_id: block.id }).max('position as p').first();
		const start = Number(last?.p ?? 0) + 1;
		await trx('beds').insert(
			names.map((name, i) => ({
				farm_id: farmId,
				block_id: block.id,
				name,
				length_ft: input.lengthFt,
				width_in: input.widthIn,
				position: start + i
			}))
		);
		return { block: input.block, names };
	});
}
