/**
 * What each durability figure rests on: for every input of an exposure class's model, its
 * value and whether it was measured, fitted or assumed, with its source. The stored parameters
 * carry no mark of who set them, so a value equal to the class default is read as the default
 * (assumed, with the default's source) and any other value as the engineer's own entry
 * (assumed by the engineer). A population projected from measured fronts has its own rows
 * (measuredProvenance.ts): the tests with their number and locations, the fitted values with
 * their standard errors, and what stays assumed (C_crit, the ageing exponent).
 */
import { roundedPercent } from '$lib/format';
import type { ExposureParameters } from './parameters';
import { CARBONATION_DEFAULTS, CHLORIDE_DEFAULTS, type SourcedValue } from './parameters';

export type InputBasis = 'measured' | 'fitted' | 'assumed';

export interface InputProvenance {
	/** The parts of the structure the row applies to. */
	part: string;
	exposureClass: string;
	input: string;
	value: string;
	basis: InputBasis;
	source: string;
}

const ENTERED = 'Entered by the engineer for this assessment; no measurement is recorded with it.';

function row(
	exposureClass: string,
	input: string,
	value: number,
	unit: string,
	fallback: SourcedValue | undefined
): Omit<InputProvenance, 'part'> {
	const isDefault = fallback !== undefined && fallback.value === value;
	return {
		exposureClass,
		input,
		value: `${value}${unit}`,
		basis: 'assumed',
		source: isDefault ? `Default: ${fallback.source}` : ENTERED
	};
}

/** The inputs of one exposure class's model, each with its basis and source. */
export function parameterProvenance(
	exposureClass: string,
	p: ExposureParameters,
	part = `all parts in ${exposureClass}`
): InputProvenance[] {
	return assumedRows(exposureClass, p).map((r) => ({ part, ...r }));
}

function assumedRows(
	exposureClass: string,
	p: ExposureParameters
): Omit<InputProvenance, 'part'>[] {
	if (p.kind === 'carbonation') {
		const d = CARBONATION_DEFAULTS[exposureClass];
		return [
			row(exposureClass, 'Carbonation coefficient k', p.kMmPerSqrtYear, ' mm/√year', d?.k),
			row(exposureClass, 'Scatter of the carbonation depth (CoV)', p.depthCov, '', d?.depthCov)
		];
	}
	const d = CHLORIDE_DEFAULTS[exposureClass];
	return [
		row(
			exposureClass,
			'Surface chloride content C_s',
			p.surfaceContent,
			' % of binder',
			d?.surfaceContent
		),
		row(
			exposureClass,
			'Initial chloride content C_0',
			p.initialContent,
			' % of binder',
			d?.initialContent
		),
		row(
			exposureClass,
			'Critical chloride content C_crit',
			p.criticalContent,
			' % of binder',
			d?.criticalContent
		),
		row(exposureClass, 'Apparent diffusion coefficient D', p.dM2PerS, ' m²/s', d?.dM2PerS),
		row(exposureClass, 'Scatter of D (CoV)', p.dCov, '', d?.dCov)
	];
}

/** The words that follow a projection resting only on assumed inputs. */
export function indicativeWords(kind: ExposureParameters['kind']): string {
	return kind === 'chloride'
		? 'Indicative: assumed, not measured. Take chloride samples (a profile by depth) before acting on this.'
		: 'Indicative: assumed, not measured. Measure carbonation depths on fresh breaks or drilled cores before acting on this.';
}

/**
 * One plain sentence where the cover verdict and the projected protection point different ways,
 * so "complies" and "act now" never stand side by side unexplained; null where they agree.
 */
export function verdictAndRiskWords(
	verdict: 'pass' | 'fail' | 'not-enough-data' | null,
	level: string,
	kind: ExposureParameters['kind'] | null,
	measured: { now: number | null; atDesignLife: number; locations: number } | null = null
): string | null {
	const agent = kind === 'chloride' ? 'chlorides' : 'carbonation';
	if (measured) return measuredVerdictWords(verdict, level, kind, measured);
	if (verdict === 'pass' && (level === 'act-now' || level === 'plan-repairs')) {
		return `The cover meets its specification, yet the ${agent} front is projected to reach the steel: the specified cover may be too little for this exposure, or the assumed ${agent} figures are too pessimistic — measure them before acting.`;
	}
	if (verdict === 'fail' && (level === 'low-concern' || level === 'keep-watching')) {
		return `The cover falls short of its specification, but the ${agent} front is not projected to reach the steel within the design life: the shortfall matters less here than the rules assume, if the assumed figures hold.`;
	}
	return null;
}

/** The same sentence where the projection rests on fronts measured on the structure. */
function measuredVerdictWords(
	verdict: 'pass' | 'fail' | 'not-enough-data' | null,
	level: string,
	kind: ExposureParameters['kind'] | null,
	m: { now: number | null; atDesignLife: number; locations: number }
): string | null {
	const front =
		kind === 'chloride'
			? `the chloride front fitted to the ${m.locations} profiles taken here`
			: `the carbonation front measured at ${m.locations} locations here`;
	const already = m.now !== null && m.now > 0 ? ` (${roundedPercent(m.now)} already)` : '';
	if (verdict === 'pass' && (level === 'act-now' || level === 'plan-repairs')) {
		return `The cover meets its specification, yet ${front} passes the cover of ${roundedPercent(m.atDesignLife)} of the readings by the design life${already}: the specified cover is too little for what was measured on this structure.`;
	}
	if (verdict === 'fail' && (level === 'low-concern' || level === 'keep-watching')) {
		return `The cover falls short of its specification, but ${front} is not projected to reach the steel within the design life: the shortfall matters less here than the rules assume.`;
	}
	return null;
}
