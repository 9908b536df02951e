import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildXlsx, sheetXml } from '../../helpers/xlsx';
import { InputError } from '$lib/server/domainErrors';
import { parsePastedMembers } from '$lib/server/intake/pastedMembers';
import { ImportError } from '$lib/server/import/errors';
import { importOptionsSchema, columnMappingSchema } from '$lib/server/import/mapping';
import { previewStagedFile } from '$lib/server/import/preview';
import { csvRecordBatches, xlsxRecordBatches } from '$lib/server/import/sources';
import { createRowValidator } from '$lib/server/import/validateRow';
import { createReadStream } from 'node:fs';

/*
 * Fuzzing of the file and input readers (fast-check, seeded). Properties: a reader answers or
 * refuses with a message for the user (ImportError / InputError), never anything else (which the
 * routes would answer with a 500); and it never holds the event loop for more than 100 ms.
 * `npm run fuzz` runs these longer (FUZZ_RUNS); `npm test` a bounded number.
 */
const RUNS = Number(process.env.FUZZ_RUNS ?? 40);
const SEED = Number(process.env.FUZZ_SEED ?? 20261204);
const MAX_STALL_MS = 100;

let dir = '';
let fileNumber = 0;
beforeAll(async () => {
	dir = await mkdtemp(join(tmpdir(), 'fractile-fuzz-'));
});
afterAll(async () => {
	await rm(dir, { recursive: true, force: true, maxRetries: 3 });
});

/**
 * Runs `work`, measuring the longest the event loop went without a turn meanwhile. A gap counts
 * only as far as the process used the CPU in it (process.cpuUsage, every thread, so it errs
 * long): on a machine whose cores other jobs share, a process also waits without holding the loop.
 */
async function watched<T>(
	work: () => Promise<T>
): Promise<{ result?: T; error?: unknown; stallMs: number }> {
	let last = performance.now();
	let lastCpu = process.cpuUsage();
	let stallMs = 0;
	const measure = () => {
		const now = performance.now();
		const cpu = process.cpuUsage(lastCpu);
		stallMs = Math.max(stallMs, Math.min(now - last, (cpu.user + cpu.system) / 1000));
		last = now;
		lastCpu = process.cpuUsage();
	};
	const timer = setInterval(measure, 2);
	try {
		const result = await work();
		measure();
		return { result, stallMs };
	} catch (error) {
		measure();
		return { error, stallMs };
	} finally {
		clearInterval(timer);
	}
}

/**
 * `work` answers or refuses with a message, and holds the event loop under MAX_STALL_MS. A case
 * over the bound is run once more and must pass then: a stall caused by the input repeats, a
 * garbage collection of earlier cases' buffers landing in this one does not.
 */
async function expectReadWithoutStall(work: () => Promise<unknown>) {
	let outcome = await watched(work);
	if (outcome.stallMs >= MAX_STALL_MS) outcome = await watched(work);
	expectUserFacing(outcome.error);
	expect(outcome.stallMs).toBeLessThan(MAX_STALL_MS);
}

function expectUserFacing(error: unknown) {
	if (error === undefined) return;
	if (!(error instanceof ImportError) && !(error instanceof InputError)) throw error;
	expect((error as Error).message.length).toBeGreaterThan(10);
}

const mapping = columnMappingSchema.parse({ memberLabel: 0, x: 1, y: 2, cover: 3, note: 4 });
const members = new Map([['m-01', 1]]);

/** Previews a file, then reads every record and checks each row, as an import would. */
async function readLikeAnImport(content: Uint8Array, name: string) {
	const path = join(dir, `f${++fileNumber}`);
	await writeFile(path, content);
	try {
		const preview = await previewStagedFile(path, name, content.length);
		const { mixedDecimalMarks: _mixed, ...settings } = preview.settings;
		const options = importOptionsSchema.parse({ ...settings, failingRows: 'import-valid' });
		const validate = createRowValidator(mapping, options, members);
		const batches =
			preview.format === 'xlsx'
				? xlsxRecordBatches(path)
				: csvRecordBatches(createReadStream(path), options);
		let rows = 0;
		for await (const batch of batches)
			for (const cells of batch) {
				validate(cells);
				rows++;
			}
		return rows;
	} finally {
		await rm(path, { force: true });
	}
}

// Text made of what matters to a CSV reader, and anything else.
const csvToken = fc.oneof(
	fc.constantFrom(',', ';', '\t', '|', '"', '\n', '\r\n', '\r', ' ', '#DIV/0!', '=1+1', '\u00a0'),
	fc.constantFrom('M-01', 'Member', 'Cover', 'X', '30.5', '-1', '1e308', '0,5', '', '\ufeff'),
	fc.string({ maxLength: 6 }),
	fc.integer({ min: -1000, max: 100_000 }).map(String)
);
const csvText = fc.array(csvToken, { maxLength: 300 }).map((t) => Buffer.from(t.join('')));
const csvBytes = fc.oneof(
	csvText,
	fc.uint8Array({ maxLength: 2048 }).map((b) => Buffer.from(b))
);

const cell = fc.oneof(
	fc.string({ maxLength: 12 }),
	fc.double({ noNaN: true, noDefaultInfinity: true }),
	fc.constantFrom('M-01', '30', '<&>"\'', ']]>', '#DIV/0!')
);
const sheetRows = fc.array(
	fc.record({
		r: fc.option(fc.integer({ min: 1, max: 1_048_576 }), { nil: undefined }),
		cells: fc.array(cell, { maxLength: 6 })
	}),
	{ maxLength: 30 }
);

/** A workbook, then maybe damaged: bytes flipped, cut short, or its sheet's XML cut or spliced. */
const xlsxBytes = fc
	.tuple(
		sheetRows,
		fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 4 }),
		fc.option(fc.nat(), { nil: undefined }),
		fc.option(fc.tuple(fc.nat(), fc.string({ maxLength: 20 })), { nil: undefined })
	)
	.map(([rows, flips, cut, splice]) => {
		const sorted = rows.filter((r) => r.r !== undefined).sort((a, b) => a.r! - b.r!);
		let xml = sheetXml(sorted);
		if (splice) {
			const at = splice[0] % (xml.length + 1);
			xml = xml.slice(0, at) + splice[1] + xml.slice(at);
		}
		const bytes = buildXlsx([
			{ name: 'Readings', xml },
			{ name: 'Other', xml: sheetXml([]) }
		]);
		for (const [at, value] of flips) bytes[at % bytes.length] = value;
		return cut === undefined ? bytes : bytes.subarray(0, cut % (bytes.length + 1));
	});

// Each case is small; a long run (FUZZ_RUNS) needs time in proportion.
describe('fuzzing the file and input readers', { timeout: 30_000 + RUNS * 500 }, () => {
	it('CSV and other bytes: answered or refused with a message, the event loop never held over 100 ms', async () => {
		await fc.assert(
			fc.asyncProperty(csvBytes, async (content) => {
				await expectReadWithoutStall(() => readLikeAnImport(content, 'readings.csv'));
			}),
			{ seed: SEED, numRuns: RUNS }
		);
	});

	it('XLSX, whole or damaged: answered or refused with a message, the event loop never held over 100 ms', async () => {
		await fc.assert(
			fc.asyncProperty(xlsxBytes, async (content) => {
				await expectReadWithoutStall(() => readLikeAnImport(content, 'readings.xlsx'));
			}),
			{ seed: SEED, numRuns: RUNS }
		);
	});

	it('XLSX undamaged: every non-empty row comes back with its own number and text', async () => {
		await fc.assert(
			fc.asyncProperty(sheetRows, async (rows) => {
				const numbered = new Map<number, (string | number)[]>();
				for (const row of rows) if (row.r !== undefined) numbered.set(row.r, row.cells);
				const sorted = [...numbered].sort((a, b) => a[0] - b[0]);
				const path = join(dir, `f${++fileNumber}.xlsx`);
				await writeFile(
					path,
					buildXlsx([{ name: 'R', xml: sheetXml(sorted.map(([r, cells]) => ({ r, cells }))) }])
				);
				const read: [number, string[]][] = [];
				for await (const batch of xlsxRecordBatches(path))
					batch.forEach((cells, i) => read.push([batch.rowNumbers![i], cells]));
				await rm(path, { force: true });
				const expected = sorted
					.map(
						([r, cells]) =>
							[r, cells.map((c) => (typeof c === 'number' ? String(c) : c))] as [number, string[]]
					)
					.filter(([, cells]) => cells.some((c) => c.trim() !== ''));
				expect(read).toEqual(expected);
			}),
			{ seed: SEED, numRuns: RUNS }
		);
	});

	it('the pasted member table: members or a message naming the row, nothing else, quickly', async () => {
		const table = fc.oneof(
			fc.array(csvToken, { maxLength: 200 }).map((t) => t.join('')),
			fc
				.array(
					fc.array(fc.oneof(csvToken, fc.constantFrom('slab', 'XC3', 'top', '25', 'label')), {
						maxLength: 8
					}),
					{ maxLength: 12 }
				)
				.map((rows) =>
					['label\ttype\tface\texposure\tc_min', ...rows.map((r) => r.join('\t'))].join('\n')
				)
		);
		await fc.assert(
			fc.asyncProperty(table, async (text) => {
				await expectReadWithoutStall(async () => parsePastedMembers(text, 'EN 1992-1-1'));
			}),
			{ seed: SEED, numRuns: RUNS * 5 }
		);
	});
});
