/** Colours of the cover map (its cells are binned by the server: $lib/populations/coverMap). */

// Viridis stops (perceptually uniform and colour-blind safe), dark = low cover.
const STOPS = ['#440154', '#3b528b', '#21918c', '#5ec962', '#fde725'];

function mix(a: string, b: string, t: number): string {
	const c = (s: string, k: number) => parseInt(s.slice(1 + 2 * k, 3 + 2 * k), 16);
	const v = [0, 1, 2].map((k) => Math.round(c(a, k) + (c(b, k) - c(a, k)) * t));
	return `rgb(${v.join(',')})`;
}

export function colourFor(valueMm: number, fromMm: number, toMm: number): string {
	const t = toMm > fromMm ? Math.min(1, Math.max(0, (valueMm - fromMm) / (toMm - fromMm))) : 0.5;
	const at = t * (STOPS.length - 1);
	const k = Math.min(STOPS.length - 2, Math.floor(at));
	return mix(STOPS[k], STOPS[k + 1], at - k);
}

export const GRADIENT = `linear-gradient(to right, ${STOPS.join(', ')})`;
