/**
 * From the engineer's parameters to the engine's DurabilityModel. No durability arithmetic
 * here: the engine (src/lib/analysis/durability) does all of it.
 */
import { m2PerSToMm2PerYear, type DurabilityModel } from '$lib/analysis';
import type { ExposureParameters } from './parameters';

/** The model family an exposure class calls for (EN 206 classes); null when neither applies. */
export function modelKindFor(exposureClass: string): 'carbonation' | 'chloride' | null {
	if (/^XC[1-4]$/.test(exposureClass)) return 'carbonation';
	if (/^X[DS][1-3]$/.test(exposureClass)) return 'chloride';
	return null;
}

export function toDurabilityModel(parameters: ExposureParameters): DurabilityModel {
	if (parameters.kind === 'carbonation') {
		return {
			kind: 'carbonation',
			kMmPerSqrtYear: parameters.kMmPerSqrtYear,
			depthCov: parameters.depthCov
		};
	}
	return {
		kind: 'chloride',
		chloride: {
			surfaceContent: parameters.surfaceContent,
			initialContent: parameters.initialContent,
			criticalContent: parameters.criticalContent,
			dRefMm2PerYear: m2PerSToMm2PerYear(parameters.dM2PerS),
			ageingExponent: parameters.ageingExponent ?? 0,
			...(parameters.tRefYears !== undefined ? { tRefYears: parameters.tRefYears } : {})
		},
		dCov: parameters.dCov
	};
}

function ageingWords(p: Extract<ExposureParameters, { kind: 'chloride' }>): string {
	const alpha = p.ageingExponent ?? 0;
	if (alpha === 0) return 'constant';
	const tRef = p.tRefYears ?? 28 / 365.25;
	return `at ${tRef.toPrecision(3)} years, ageing as (t_ref/t)^${alpha}`;
}

/** A sentence naming the model and its parameters, for the method statement. */
export function describeParameters(exposureClass: string, p: ExposureParameters): string {
	if (p.kind === 'carbonation') {
		return (
			`${exposureClass}: carbonation x = k·√t with k = ${p.kMmPerSqrtYear} mm/√year ` +
			`(scatter of the depth, CoV ${p.depthCov}).`
		);
	}
	return (
		`${exposureClass}: chloride ingress by Fick's second law with C_s = ${p.surfaceContent} %, ` +
		`C_0 = ${p.initialContent} %, C_crit = ${p.criticalContent} % (by mass of binder), ` +
		`D = ${p.dM2PerS.toExponential(2)} m²/s ${ageingWords(p)} (CoV ${p.dCov}).`
	);
}
