import type { SiteEntry } from './queue';

const quote = (v: string | number) => {
	const s = String(v);
	return /[",\n\r]/.test(s) || /^[=+\-@]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

/**
 * Entries the server refused, as a CSV a person can keep or import later: one line per reading
 * or hole, with the reason. Cells that a spreadsheet would run as a formula are quoted.
 */
export function refusedCsv(entries: SiteEntry[]): string {
	const head = ['member', 'kind', 'x', 'y', 'cover', 'diameter', 'direction', 'note', 'reason'];
	const lines = entries.flatMap((e) => {
		if (e.kind === 'reading') {
			const d = e.data;
			return [[e.memberLabel, 'reading', d.x, d.y, d.cover, d.diameter, d.direction, d.note]];
		}
		if (e.kind === 'hole') {
			const d = e.data;
			const note = `hole ${d.label}: measured ${d.measuredCoverMm} mm${d.method ? `, ${d.method}` : ''}`;
			return [[e.memberLabel, 'hole', d.xMm, d.yMm, d.meterReadingMm, '', '', note]];
		}
		return [[e.memberLabel, 'photo', '', '', '', '', '', `${e.data.fileName} ${e.data.caption}`]];
	});
	return [head, ...lines.map((l, i) => [...l, entries[i].refusal ?? ''])]
		.map((l) => l.map(quote).join(','))
		.join('\r\n');
}
