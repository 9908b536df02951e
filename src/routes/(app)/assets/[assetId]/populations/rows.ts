/**
 * Overview rows: the figures of each population as the table shows and sorts them, read from
 * the engine's result (nothing is computed here), and the same rows as CSV.
 */
import type { RuleOutcome } from '$lib/analysis';
import type { PopulationResult } from '$lib/server/populations/service';
import { csvLine } from '$lib/csv';

export interface OverviewRow {
	id: string;
	label: string;
	href: string;
	members: number;
	n: number | null;
	meanMm: number | null;
	sdMm: number | null;
	p5Mm: number | null;
	characteristicMm: number | null;
	method: string;
	cMinMm: number;
	below: number | null;
	belowLower: number | null;
	belowUpper: number | null;
	/** The one-sided upper bound the share-below rule judges, at `confidence`. */
	belowUpperBound: number | null;
	confidence: number | null;
	verdict: RuleOutcome | null;
	rules: { title: string; outcome: string; reason: string }[];
	note: string | null;
}

export function toRow(p: PopulationResult, detailHref: string): OverviewRow {
	const a = p.assessment;
	return {
		id: p.id,
		label: p.label,
		href: detailHref,
		members: p.members.length,
		n: a?.description.n ?? p.members.reduce((s, m) => s + m.readings, 0),
		meanMm: a?.description.meanMm ?? null,
		sdMm: a?.description.sdMm ?? null,
		p5Mm: a?.percentiles.find((q) => q.p === 0.05)?.valueMm ?? null,
		characteristicMm: a?.characteristic.chosenMm ?? null,
		method: a
			? `${a.characteristic.chosenBasis}; lower ${Math.round(a.options.fractileP * 100)} % fractile`
			: '',
		cMinMm: p.requirement.requirement.cMinMm,
		below: a?.fractionBelowCMin.empirical ?? null,
		belowLower: a?.fractionBelowCMin.interval.lower ?? null,
		belowUpper: a?.fractionBelowCMin.interval.upper ?? null,
		belowUpperBound: a?.fractionBelowCMin.upperBound ?? null,
		confidence: a?.fractionBelowCMin.confidence ?? null,
		verdict: a?.verdict ?? null,
		rules: a?.rules.map((r) => ({ title: r.title, outcome: r.outcome, reason: r.reason })) ?? [],
		note: p.problem ?? p.requirement.note
	};
}

export type SortKey =
	'label' | 'n' | 'meanMm' | 'sdMm' | 'p5Mm' | 'characteristicMm' | 'below' | 'verdict';

export function sortRows(rows: OverviewRow[], key: SortKey, ascending: boolean): OverviewRow[] {
	const sign = ascending ? 1 : -1;
	return [...rows].sort((a, b) => {
		const x = a[key];
		const y = b[key];
		if (x === y) return 0;
		if (x === null) return 1;
		if (y === null) return -1;
		return (x < y ? -1 : 1) * sign;
	});
}

export function toCsv(rows: OverviewRow[]): string {
	const header = [
		'population',
		'members',
		'n',
		'mean_mm',
		'sd_mm',
		'p5_mm',
		'characteristic_mm',
		'method',
		'c_min_mm',
		'fraction_below_c_min',
		'interval_lower',
		'interval_upper',
		'verdict',
		'reasons'
	];
	const lines = rows.map((r) =>
		csvLine([
			r.label,
			r.members,
			r.n,
			r.meanMm,
			r.sdMm,
			r.p5Mm,
			r.characteristicMm,
			r.method,
			r.cMinMm,
			r.below,
			r.belowLower,
			r.belowUpper,
			r.verdict ?? 'not judged',
			r.rules.map((x) => `${x.title}: ${x.outcome}. ${x.reason}`).join(' | ')
		])
	);
	return csvLine(header) + lines.join('');
}
