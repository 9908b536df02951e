import { describe, expect, it } from 'vitest';
import {
	compareMembers,
	holmAdjust,
	kruskalWallis,
	mannWhitney,
	oneWayAnova,
	poolSorted,
	toSortedCovers
} from '../../../src/lib/analysis/index';

// Three invented members (mm), with ties within and across them.
const A = toSortedCovers([42, 45, 45, 47, 50, 51, 53]);
const B = toSortedCovers([38, 40, 41, 41, 44, 45]);
const C = toSortedCovers([50, 52, 55, 55, 57, 58, 60, 61]);
const POOLED = poolSorted([A, B, C]);
const close = (value: number, expected: number, relative = 1e-9) =>
	expect(Math.abs(value / expected - 1)).toBeLessThan(relative);

describe('Kruskal–Wallis with tie correction (scipy 1.17.1 stats.kruskal)', () => {
	it('H = 15.500768800670958, p = 0.00043057699481854574', () => {
		const kw = kruskalWallis([A, B, C], POOLED);
		close(kw.statistic, 15.500768800670958);
		close(kw.pValue, 0.00043057699481854574, 1e-6);
		expect(kw.degreesOfFreedom).toBe(2);
	});
	it('every reading equal: H = 0, p = 1 (no 0/0)', () => {
		const same = Float64Array.of(40, 40, 40);
		const kw = kruskalWallis([same, same], poolSorted([same, same]));
		expect(kw.statistic).toBe(0);
		expect(kw.pValue).toBe(1);
	});
});

describe('one-way ANOVA (scipy 1.17.1 stats.f_oneway) and its variance components', () => {
	it('F = 29.721217887725963, p = 1.9798920308767375e-06', () => {
		const anova = oneWayAnova([A, B, C]);
		close(anova.statistic, 29.721217887725963);
		close(anova.pValue, 1.9798920308767375e-6, 1e-6);
	});
	it('within SD √MS_w = 3.53722 mm; between SD √((MS_b − MS_w)/n₀) = 7.18946 mm, n₀ = 6.95238 (Searle et al. 1992 §3.6, numpy arithmetic)', () => {
		const anova = oneWayAnova([A, B, C]);
		close(anova.withinSdMm, 3.5372170928435764);
		close(anova.betweenSdMm, 7.189461465532975);
	});
});

describe('Mann–Whitney, two-sided, asymptotic with tie and continuity corrections (scipy 1.17.1 mannwhitneyu)', () => {
	it('U = 4, p = 0.17060874485083155 for 1 2 2 3 5 against 2 4 6 7', () => {
		const mw = mannWhitney(toSortedCovers([1, 2, 2, 3, 5]), toSortedCovers([2, 4, 6, 7]));
		expect(mw.u).toBe(4);
		close(mw.pValue, 0.17060874485083155, 1e-9);
	});
});

describe('Holm (1979) step-down correction (hand arithmetic)', () => {
	it('0.01, 0.04, 0.03 → 3·0.01, max(0.03, 2·0.03), max(0.06, 1·0.04) = 0.03, 0.06, 0.06', () => {
		const adjusted = holmAdjust([0.01, 0.04, 0.03]);
		expect(adjusted[0]).toBeCloseTo(0.03, 12);
		expect(adjusted[1]).toBeCloseTo(0.06, 12);
		expect(adjusted[2]).toBeCloseTo(0.06, 12);
	});
});

describe('members that stand apart', () => {
	const comparison = compareMembers(
		[
			{ label: 'A', coversMm: A },
			{ label: 'B', coversMm: B },
			{ label: 'C', coversMm: C }
		],
		POOLED
	)!;
	it('each member against the rest: U and p as scipy 1.17.1 mannwhitneyu(member, rest)', () => {
		const [a, b, c] = comparison.differences;
		expect([a.u, b.u, c.u]).toEqual([42.5, 3, 100.5]);
		close(a.pValue, 0.6536848251089621, 1e-9);
		close(b.pValue, 0.00120312426661449, 1e-9);
		close(c.pValue, 0.0004937576293800978, 1e-9);
	});
	it('Holm over the three (hand: 3·0.000494, 2·0.001203, 0.6537); B lower, C higher, A not apart', () => {
		const [a, b, c] = comparison.differences;
		close(c.holmPValue, 3 * 0.0004937576293800978, 1e-9);
		close(b.holmPValue, 2 * 0.00120312426661449, 1e-9);
		close(a.holmPValue, 0.6536848251089621, 1e-9);
		expect([a.standsApart, b.standsApart, c.standsApart]).toEqual([false, true, true]);
		expect([b.direction, c.direction]).toEqual(['lower', 'higher']);
	});
	it('medians of the member and of the rest (numpy median: 41 against 52 for B, 56 against 45 for C)', () => {
		const [a, b, c] = comparison.differences;
		expect([a.medianMm, a.restMedianMm]).toEqual([47, 51]);
		expect([b.medianMm, b.restMedianMm]).toEqual([41, 52]);
		expect([c.medianMm, c.restMedianMm]).toEqual([56, 45]);
	});
	it('names the members in words', () => {
		expect(comparison.sentences.join(' ')).toContain(
			'Member B is lower than the other 2: median 41.0 mm against 52.0 mm'
		);
		expect(comparison.sentences[0]).toMatch(/do not share one distribution/);
	});
	it('the median of the rest equals the median of the rest computed directly (property)', () => {
		for (let seed = 1; seed <= 20; seed++) {
			const groups = [0, 1, 2, 3].map((g) =>
				toSortedCovers(
					Array.from(
						{ length: 3 + ((seed * (g + 1)) % 7) },
						(_, i) => ((seed * 31 + i * 17 + g * 7) % 23) + 30
					)
				)
			);
			const pooled = poolSorted(groups);
			const c = compareMembers(
				groups.map((coversMm, i) => ({ label: String(i), coversMm })),
				pooled
			)!;
			groups.forEach((_, i) => {
				const rest = poolSorted(groups.filter((__, j) => j !== i));
				const m = rest.length;
				const direct = m % 2 ? rest[(m - 1) / 2] : (rest[m / 2 - 1] + rest[m / 2]) / 2;
				expect(c.differences[i].restMedianMm).toBe(direct);
			});
		}
	});
});
