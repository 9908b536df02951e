import { describe, expect, it } from 'vitest';
import { CHLORIDE_DEFAULTS } from '$lib/server/risk/parameters';
import {
	indicativeWords,
	parameterProvenance,
	verdictAndRiskWords
} from '$lib/server/risk/provenance';

const xd3 = CHLORIDE_DEFAULTS.XD3;
const defaults = {
	kind: 'chloride' as const,
	surfaceContent: xd3.surfaceContent.value,
	initialContent: xd3.initialContent.value,
	criticalContent: xd3.criticalContent.value,
	dM2PerS: xd3.dM2PerS.value,
	dCov: xd3.dCov.value
};

describe('what a projection rests on', () => {
	it('marks every default as assumed with its stated source, "from memory" kept', () => {
		const rows = parameterProvenance('XD3', defaults);
		expect(rows).toHaveLength(5);
		expect(rows.every((r) => r.basis === 'assumed')).toBe(true);
		const d = rows.find((r) => r.input.startsWith('Apparent diffusion'))!;
		expect(d.value).toBe('1e-12 m²/s');
		expect(d.source).toMatch(/^Default: From memory/);
	});

	it('marks a value the engineer changed as entered, not as the default', () => {
		const rows = parameterProvenance('XD3', { ...defaults, surfaceContent: 4.2 });
		const cs = rows.find((r) => r.input.startsWith('Surface'))!;
		expect(cs.value).toBe('4.2 % of binder');
		expect(cs.source).toMatch(/Entered by the engineer/);
		expect(cs.basis).toBe('assumed');
	});

	it('says in words to measure before acting on an assumed projection', () => {
		expect(indicativeWords('chloride')).toMatch(/assumed, not measured.*chloride samples/);
		expect(indicativeWords('carbonation')).toMatch(/carbonation depths/);
	});

	it('explains "complies" beside "act now", and a shortfall beside "low concern", and nothing where they agree', () => {
		expect(verdictAndRiskWords('pass', 'act-now', 'chloride')).toMatch(
			/meets its specification, yet the chlorides front/
		);
		expect(verdictAndRiskWords('fail', 'low-concern', 'carbonation')).toMatch(
			/falls short of its specification, but the carbonation front/
		);
		expect(verdictAndRiskWords('fail', 'act-now', 'chloride')).toBeNull();
		expect(verdictAndRiskWords('pass', 'low-concern', 'chloride')).toBeNull();
	});

	it('says what was measured where cover complies but the measured front has reached bars (and the reverse)', () => {
		const measured = { now: 0.51, atDesignLife: 0.86, locations: 6 };
		expect(verdictAndRiskWords('pass', 'act-now', 'chloride', measured)).toBe(
			'The cover meets its specification, yet the chloride front fitted to the 6 profiles taken here passes the cover of 86 % of the readings by the design life (51 % already): the specified cover is too little for what was measured on this structure.'
		);
		expect(
			verdictAndRiskWords('fail', 'keep-watching', 'carbonation', { ...measured, locations: 3 })
		).toMatch(
			/falls short of its specification, but the carbonation front measured at 3 locations/
		);
		expect(verdictAndRiskWords('pass', 'low-concern', 'chloride', measured)).toBeNull();
	});
});
