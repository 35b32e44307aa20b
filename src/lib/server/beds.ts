// Blocks and beds of one farm. Every query is scoped by farm: no row of another farm is read or written.
import { db } from './db';

import type { Bed, Block } from '$lib/types';

export type { Bed, Block };

export async function listBlocks(farmId: number): Promise<Block[]> {
	return db()('blocks').where({ farm_id: farmId }).orderBy(['position', 'name']).select('id', 'name', 'position');
}

export async function list(farmId: number): Promise<Bed[]> {
	const rows = await db()('beds as b')
		.join('blocks as k', 'k.id', 'b.block_id')
		.where('b.farm_id', farmId)
		.orderBy([{ column: 'k.position' }, { column: 'b.position' }, { column: 'b.name' }])
		.select('b.id', 'b.block_id', 'k.name as block_name', 'b.name', 'b.length_ft', 'b.width_in', 'b.position');
	return rows.map((r) => ({
		id: r.id,
		blockId: r.block_id,
		blockName: r.block_name,
		name: r.name,
		lengthFt: Number(r.length_ft),
		widthIn: r.width_in,
		position: r.position
	}));
}

export class BedInputError extends Error {
	constructor(
		public field: string,
		message: string
	) {
		super(message);
	}
}

async function assertBlockOfFarm(farmId: number, blockId: number): Promise<void> {
	const block = await db()('blocks').where({ id: blockId, farm_id: farmId }).first('id');
	if (!block) throw new BedInputError('blockId', "Choose one of this farm's blocks.");
}

async function assertNameFree(farmId: number, name: string, exceptId?: number): Promise<void> {
	const q = db()('beds').where({ farm_id: farmId, name });
	if (exceptId) q.whereNot({ id: exceptId });
	if (await q.first('id')) throw new BedInputError('name', `A bed named "${name}" already exists on this farm.`);
}

type BedInput = { name: string; blockId: number; lengthFt: number; widthIn: number; position: number };

export async function create(farmId: number, input: BedInput): Promise<number> {
	await assertBlockOfFarm(farmId, input.blockId);
	await assertNameFree(farmId, input.name);
	const [id] = await db()('beds').insert({
		farm_id: farmId,
		block_id: input.blockId,
		name: input.name,
		length_ft: input.lengthFt,
		width_in: input.widthIn,
		position: input.position
	});
	return id;
}

export async function update(farmId: number, bedId: number, input: BedInput): Promise<boolean> {
	await assertBlockOfFarm(farmId, input.blockId);
	await assertNameFree(farmId, input.name, bedId);
	const n = await db()('beds').where({ id: bedId, farm_id: farmId }).update({
		block_id: input.blockId,
		name: input.name,
		length_ft: input.lengthFt,
		width_in: input.widthIn,
		position: input.position
	});
	return n > 0;
}

/** Removes a bed; its plantings stay in the plan, unplaced, so nothing of the plan is lost. */
export async function remove(farmId: number, bedId: number): Promise<boolean> {
	// The plantings come off the bed first: the (farm_id, bed_id) key would take them with it.
	return db().transaction(async (trx) => {
		// Every season of the farm, shared and in id order, as a planting edit takes its season's lock.
		await trx('seasons').where({ farm_id: farmId }).orderBy('id').forShare().select('id');
		await trx('plantings')
			.where({ farm_id: farmId, bed_id: bedId })
			.update({ bed_id: null, version: trx.raw('version + 1') });
		return (await trx('beds').where({ id: bedId, farm_id: farmId }).delete()) > 0;
	});
}

export async function createBlock(farmId: number, name: string): Promise<number> {
	if (await db()('blocks').where({ farm_id: farmId, name }).first('id'))
		throw new BedInputError('name', `A block named "${name}" already exists.`);
	const max = await db()('blocks').where({ farm_id: farmId }).max('position as p').first();
	const [id] = await db()('blocks').insert({ farm_id: farmId, name, position: Number(max?.p ?? 0) + 1 });
	return id;
}
