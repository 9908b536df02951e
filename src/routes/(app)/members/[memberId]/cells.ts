/** Colours of the cover map (its cells are binned by the server: $lib/populations/coverMap). */

// Viridis stops (perceptually uniform and colour-blind safe), dark = low cover.
const STOPS = ['#440154', '#3b528b', '#21918c', '#5ec962', '#fde725'];

/** Cells below c_min: one hue outside the ramp, so "below" never reads as "a little low". */
export const BELOW_COLOUR = '#e4572e';

function mix(a: string, b: string, t: number): string {
	const c = (s: string, k: number) => parseInt(s.slice(1 + 2 * k, 3 + 2 * k), 16);
	const v = [0, 1, 2].map((k) => Math.round(c(a, k) + (c(b, k) - c(a, k)) * t));
	return `rgb(${v.join(',')})`;
}

/**
 * The ramp runs from c_min (its dark end) to the top of the scale, so the same cover has the
 * same colour on every member of the requirement; anything below c_min is BELOW_COLOUR.
 */
export function colourFor(valueMm: number, cMinMm: number, topMm: number): string {
	if (valueMm < cMinMm) return BELOW_COLOUR;
	const t = topMm > cMinMm ? Math.min(1, (valueMm - cMinMm) / (topMm - cMinMm)) : 0;
	const at = t * (STOPS.length - 1);
	const k = Math.min(STOPS.length - 2, Math.floor(at));
	return mix(STOPS[k], STOPS[k + 1], at - k);
}

/** The top of the scale: the greatest least-cover, and at least c_min + 10 mm. */
export const rampTop = (cMinMm: number, range: [number, number] | null) =>
	Math.max(cMinMm + 10, range?.[1] ?? 0);

export const GRADIENT = `linear-gradient(to right, ${STOPS.join(', ')})`;

/** Round tick steps (mm) so that a length has about `count` ticks. */
export function ticks(lengthMm: number, count: number): number[] {
	const raw = lengthMm / Math.max(1, count);
	const power = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? raw;
	const out: number[] = [];
	for (let v = 0; v <= lengthMm + 1e-9; v += step) out.push(v);
	return out;
}
