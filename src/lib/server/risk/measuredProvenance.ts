/**
 * What a projection from measured fronts rests on, input by input: the cover readings and the
 * tests measured (with their number and locations), Cs and Da fitted (mean over the profiles
 * with its standard error, and each fit's own), and what stays assumed — C_crit with its
 * source, the ageing exponent (none: Da taken constant from the age of sampling).
 */
import { roundedPercent } from '$lib/format';
import type { PopulationRisk } from './compute';
import type { MeasuredLocation, MeasuredRisk } from './measured';
import type { InputProvenance } from './provenance';

const fixed = (v: number, digits: number) => v.toFixed(digits);

function meanAndSe(values: number[]): { mean: number; se: number | null } {
	const m = values.length;
	const mean = values.reduce((s, v) => s + v, 0) / m;
	if (m < 2) return { mean, se: null };
	const ss = values.reduce((s, v) => s + (v - mean) ** 2, 0);
	return { mean, se: Math.sqrt(ss / (m - 1) / m) };
}

/** "CP-01 (L2-BAY-01), CP-02 (L2-BAY-03) …": where the tests were taken. */
export function locationWords(locations: readonly MeasuredLocation[]): string {
	return locations.map((l) => `${l.label} (${l.memberLabel})`).join(', ');
}

function carbonationRows(m: MeasuredRisk): Omit<InputProvenance, 'part' | 'exposureClass'>[] {
	const ks = m.locations.map((l) => l.kMmPerSqrtYear ?? 0);
	const { mean, se } = meanAndSe(ks);
	const readings = m.locations.reduce((s, l) => s + (l.readings ?? 0), 0);
	return [
		{
			input: 'Carbonation coefficient k = x/√t',
			value: `${fixed(mean, 2)} mm/√year${se === null ? '' : ` ± ${fixed(se, 2)} (SE)`}`,
			basis: 'measured',
			source: `${m.locations.length} carbonation tests, ${readings} depths read, k from ${fixed(Math.min(...ks), 2)} to ${fixed(Math.max(...ks), 2)} mm/√year: ${locationWords(m.locations)}.`
		}
	];
}

function fittedRow(
	input: string,
	values: number[],
	fitSes: number[],
	unit: string,
	format: (v: number) => string,
	count: number
): Omit<InputProvenance, 'part' | 'exposureClass'> {
	const { mean, se } = meanAndSe(values);
	const range = `${format(Math.min(...values))}–${format(Math.max(...values))}`;
	const fitSe = `${format(Math.min(...fitSes))}–${format(Math.max(...fitSes))}`;
	return {
		input,
		value: `${format(mean)}${unit}${se === null ? '' : ` ± ${format(se)} (SE)`}`,
		basis: 'fitted',
		source: `Mean of ${count} fitted profiles (range ${range}); each fit's standard error ${fitSe}. Nonlinear least squares, outermost increment left out (ASTM C1556, NT BUILD 443).`
	};
}

function chlorideRows(m: MeasuredRisk): Omit<InputProvenance, 'part' | 'exposureClass'>[] {
	const fitted = m.locations.filter((l) => l.fit?.status === 'fitted').map((l) => l.fit!);
	const refused = m.locations.length - fitted.length;
	const initial = fitted.map((f) => f.initialContent);
	const measuredCi = initial.filter((c) => c.basis === 'measured').length;
	const critical = m.criticalContent!;
	const ciLow = Math.min(...initial.map((c) => c.value));
	const ciHigh = Math.max(...initial.map((c) => c.value));
	return [
		fittedRow(
			'Surface chloride content C_s',
			fitted.map((f) => f.surfaceContent!),
			fitted.map((f) => f.surfaceContentSe!),
			' % of binder',
			(v) => fixed(v, 2),
			fitted.length
		),
		fittedRow(
			'Apparent diffusion coefficient D_a',
			fitted.map((f) => f.dM2PerS!),
			fitted.map((f) => f.dSeM2PerS!),
			' m²/s',
			(v) => v.toExponential(2),
			fitted.length
		),
		{
			input: 'Chloride profiles',
			value: `${fitted.length} fitted${refused ? `, ${refused} refused` : ''}`,
			basis: 'measured',
			source: `Dust by depth increments at ${locationWords(m.locations)}.`
		},
		{
			input: 'Initial chloride content C_0',
			value: `${ciLow === ciHigh ? fixed(ciLow, 2) : `${fixed(ciLow, 2)}–${fixed(ciHigh, 2)}`} % of binder`,
			basis: measuredCi === initial.length ? 'measured' : 'assumed',
			source:
				measuredCi === initial.length
					? 'Given with each profile (background content of the concrete).'
					: `Given with ${measuredCi} of ${initial.length} profiles; the others take the stated default.`
		},
		{
			input: 'Critical chloride content C_crit',
			value: `${critical.value} % of binder`,
			basis: 'assumed',
			source: critical.source
		},
		{
			input: 'Ageing exponent α',
			value: '0',
			basis: 'assumed',
			source:
				'None applied: D_a taken constant from the age of sampling on (our choice; ageing would slow the front and is binder-dependent).'
		}
	];
}

/** Every input of one population's measured projection, with its basis and source. */
export function measuredProvenance(p: PopulationRisk, measured: MeasuredRisk): InputProvenance[] {
	const cover: Omit<InputProvenance, 'part' | 'exposureClass'> = {
		input: 'Cover to the bars',
		value: `${p.n} readings`,
		basis: 'measured',
		source: `Cover-meter readings on ${p.memberCount} members, as assessed.`
	};
	const rows = measured.kind === 'carbonation' ? carbonationRows(measured) : chlorideRows(measured);
	return [cover, ...rows].map((r) => ({ part: p.label, exposureClass: p.exposureClass, ...r }));
}

const INPUT_WORDS: Record<string, { name: string; unit: (sd: number) => string }> = {
	'cover-mean': { name: 'the mean cover', unit: (sd) => `${fixed(sd, 2)} mm` },
	'cover-sd': { name: 'the scatter of the cover', unit: (sd) => `${fixed(sd, 2)} mm` },
	'surface-content': {
		name: 'the surface chloride content C_s',
		unit: (sd) => `${fixed(sd, 2)} % of binder`
	},
	'diffusion-coefficient': {
		name: 'the diffusion coefficient D_a',
		unit: (sd) => `${fixed(sd, 1)} mm²/year`
	},
	'critical-content': {
		name: 'the critical chloride content C_crit',
		unit: (sd) => `${fixed(sd, 2)} % of binder`
	},
	'ageing-exponent': { name: 'the ageing exponent', unit: (sd) => fixed(sd, 2) },
	'carbonation-rate': {
		name: 'the carbonation coefficient k',
		unit: (sd) => `${fixed(sd, 2)} mm/√year`
	}
};

/** One line: which input, moved by one standard deviation, changes the share at the design life most. */
export function sensitivityWords(measured: MeasuredRisk | null | undefined): string {
	if (!measured)
		return 'Not ranked: every input is assumed, with no measured spread to move it by.';
	const s = measured.sensitivity;
	const share = roundedPercent(measured.atDesignLife.share);
	if (!s || (s.shareMinus === measured.atDesignLife.share && s.sharePlus === s.shareMinus))
		return `No input moved by one standard deviation changes the share at the design life (${share}).`;
	const words = INPUT_WORDS[s.input];
	return `Most telling input: ${words.name} — one standard deviation either way (${words.unit(s.sd)}; ${s.basis}) moves the share at the design life from ${share} to ${roundedPercent(s.shareMinus)} or ${roundedPercent(s.sharePlus)}.`;
}
