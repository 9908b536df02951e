import { csvLine, type CsvValue } from '$lib/csv';
import type { SiteEntry } from './queue';

/** A cell as typed: a plain number is written as a number (a negative x is data), else text. */
const cell = (v: string): CsvValue => (/^-?\d+(\.\d+)?$/.test(v.trim()) ? Number(v) : v);

/**
 * Entries the server refused, as a CSV a person can keep or import later: one line per reading,
 * hole or photo, with the reason. Written by the app's one CSV writer and its formula guard.
 */
export function refusedCsv(entries: SiteEntry[]): string {
	const head = ['member', 'kind', 'x', 'y', 'cover', 'diameter', 'direction', 'note', 'reason'];
	const lines = entries.map((e) => {
		const reason = e.refusal ?? '';
		if (e.kind === 'reading') {
			const d = e.data;
			const cells = [d.x, d.y, d.cover, d.diameter].map(cell);
			return [e.memberLabel, 'reading', ...cells, d.direction, d.note, reason];
		}
		if (e.kind === 'hole') {
			const d = e.data;
			const note = `hole ${d.label}: measured ${d.measuredCoverMm} mm${d.method ? `, ${d.method}` : ''}`;
			const cells = [d.xMm, d.yMm, d.meterReadingMm].map(cell);
			return [e.memberLabel, 'hole', ...cells, '', '', note, reason];
		}
		const note = `${e.data.fileName} ${e.data.caption}`.trim();
		return [e.memberLabel, 'photo', '', '', '', '', '', note, reason];
	});
	return [head, ...lines].map(csvLine).join('');
}
