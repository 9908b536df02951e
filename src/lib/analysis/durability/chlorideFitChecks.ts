/**
 * When a chloride profile cannot carry a fit: no gradient to fit, or a fitted curve that the
 * data do not pin down. Plain-language reasons for the engineer; the bounds are our choice.
 */
import type { ChlorideFitRefused } from './chlorideProfileFit';

export type Refusal = { code: ChlorideFitRefused['code']; reason: string };

/** Largest value (a loop: spreading a typed array into Math.max goes through its iterator). */
export function largest(values: Float64Array): number {
	let m = -Infinity;
	for (let i = 0; i < values.length; i++) if (values[i] > m) m = values[i];
	return m;
}

/** Contents not falling with depth, or all at or below Ci: nothing to fit. */
export function hasGradient(depths: Float64Array, contents: Float64Array, ci: number): boolean {
	const n = depths.length;
	const mx = depths.reduce((s, x) => s + x, 0) / n;
	const my = contents.reduce((s, y) => s + y, 0) / n;
	let sxy = 0;
	for (let i = 0; i < n; i++) sxy += (depths[i] - mx) * (contents[i] - my);
	return sxy < 0 && largest(contents) > ci;
}

/** JᵀJ singular: the two parameters cannot be told apart (no standard errors). */
export function identifiable(jtj: [number, number, number]): Refusal | null {
	const [a00, a01, a11] = jtj;
	if (a00 * a11 - a01 * a01 > 1e-12 * a00 * a11) return null;
	return {
		code: 'undetermined',
		reason:
			'The surface content and the diffusion coefficient cannot be told apart from these increments.'
	};
}

/**
 * The data fix Da only where the fitted curve bends within the sampled depths. When
 * x/(2√(Da·t)) stays below 0.05 at the deepest point the curve is flat there (erfc falls by
 * under 6 %) and Da runs off to any large value; above 3 at the shallowest (erfc < 3e-5)
 * every point sits at Ci and Cs is not seen. Both bounds are our choice.
 */
/** `x` ascending (the points are sorted by depth). */
export function determinedWithin(x: Float64Array, da: number, t: number): Refusal | null {
	const scale = 1 / (2 * Math.sqrt(da * t));
	if (x[x.length - 1] * scale < 0.05)
		return {
			code: 'no-gradient',
			reason:
				'The chloride content hardly falls over the sampled depths, so the diffusion ' +
				'coefficient is not determined: sample deeper.'
		};
	if (x[0] * scale > 3)
		return {
			code: 'undetermined',
			reason:
				'Every fitted increment is at the initial content: the surface content cannot be ' +
				'told from these increments; sample in thinner increments near the surface.'
		};
	return null;
}

export function fitWarnings(
	n: number,
	cs: number,
	seCs: number,
	da: number,
	seDa: number,
	y: Float64Array
): string[] {
	const warnings: string[] = [];
	// Five or more fitted points: our choice (common practice in profile grinding), from memory.
	if (n < 5) warnings.push(`Only ${n} increments fitted: the standard errors rest on few points.`);
	if (seDa > 0.5 * da || seCs > 0.5 * cs)
		warnings.push('The fitted values are uncertain: a standard error exceeds half the value.');
	if (cs > 2 * largest(y))
		warnings.push('The surface content is extrapolated to more than twice the highest measured.');
	return warnings;
}
