// The season workbook as a streamed file response: read the season, work out every sheet's
// rows, then let exceljs write them straight into the response body.
import { Writable } from 'node:stream';
import { todayIn } from '$lib/today';
import type { Season } from '../seasons';
import { loadSeasonData } from './season-data';
import { buildSheetRows, rowCount } from './rows';
import { writeWorkbook } from './workbook';

/**
 * Compressed bytes per written row, measured on the demo and bench seasons (about 40–60):
 * the page divides received bytes by this estimate to show progress while the file streams,
 * since a streamed body has no Content-Length.
 */
const BYTES_PER_ROW = 56;
const FIXED_BYTES = 9_000;

export interface SeasonExport {
	filename: string;
	rows: number;
	estimatedBytes: number;
	body: ReadableStream<Uint8Array>;
}

/** A file name that is safe in any file system and header: letters, digits and dashes. */
export function exportFilename(farmName: string, season: Season): string {
	const slug = farmName
		.normalize('NFKD')
		.replace(/[^\w\s-]/g, '')
		.trim()
		.toLowerCase()
		.replace(/[\s_]+/g, '-')
		.replace(/-+/g, '-')
		.slice(0, 40)
		.replace(/-$/, '');
	return `furrowcast-${slug || 'farm'}-${season.year}.xlsx`;
}

/**
 * A web stream fed by a Node writable (what exceljs writes into). Backpressure is kept: when
 * the response has HIGH_WATER bytes queued that the client has not taken yet, the writer
 * waits for the next pull instead of piling the whole file up in memory.
 */
const HIGH_WATER = 1024 * 1024;

function streamPair(): { sink: Writable; body: ReadableStream<Uint8Array>; fail(err: Error): void } {
	let controller!: ReadableStreamDefaultController<Uint8Array>;
	let waiting: (() => void) | null = null;
	const body = new ReadableStream<Uint8Array>(
		{
			start(c) {
				controller = c;
			},
			pull() {
				const go = waiting;
				waiting = null;
				go?.();
			}
		},
		new ByteLengthQueuingStrategy({ highWaterMark: HIGH_WATER })
	);
	const sink = new Writable({
		write(chunk: Buffer, _encoding, done) {
			controller.enqueue(new Uint8Array(chunk.buffer, chunk.byteOffset, chunk.byteLength));
			if ((controller.desiredSize ?? 1) > 0) done();
			else waiting = done;
		},
		final(done) {
			controller.close();
			done();
		}
	});
	return { sink, body, fail: (err) => controller.error(err) };
}

export async function exportSeason(farmId: number, season: Season): Promise<SeasonExport> {
	const data = await loadSeasonData(farmId, season);
	const rows = buildSheetRows(data, todayIn(data.farmTimeZone));
	const { sink, body, fail } = streamPair();
	// Not awaited: the response starts while the workbook is still being written. A failure
	// part-way errors the body, so the download fails instead of looking complete.
	writeWorkbook(rows, sink, { farm: data.farmName, season: data.season.name }, data.unitSystem, data.currency).catch(
		(err: unknown) => fail(err instanceof Error ? err : new Error(String(err)))
	);
	const n = rowCount(rows);
	return {
		filename: exportFilename(data.farmName, season),
		rows: n,
		estimatedBytes: FIXED_BYTES + n * BYTES_PER_ROW,
		body
	};
}
