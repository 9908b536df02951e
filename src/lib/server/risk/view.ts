/** What the pages get: plain figures of an assessed source, without the snapshot's bulk. */
import { roundedPercent } from '$lib/format';
import { RISK_WORDS, type RiskLevel } from './levels';
import type { AssessedSource } from './portfolio';
import { worstFirst } from './summary';
import type { PopulationRisk, RiskAtAge } from './compute';
import { locationWords, measuredProvenance, sensitivityWords } from './measuredProvenance';
import {
	indicativeWords,
	parameterProvenance,
	verdictAndRiskWords,
	type InputProvenance
} from './provenance';

/** How a projected share was obtained, and what it is known to within. */
export interface ShareView {
	label: string;
	modelProbability: number;
	/** β; null where it is not claimed (a simulation with no hit: P < 1/N). */
	reliabilityIndex: number | null;
	meetsTarget: boolean;
	method: RiskAtAge['method'];
	/** Simulated shares: "< 1/N" when no sample depassivated, and the standard error. */
	lessThan: number | null;
	standardError: number | null;
	samples: number | null;
	/** Measured fronts: the bootstrap band, 5 % to 95 %. */
	band: { low: number; high: number } | null;
}

export interface PopulationRiskView {
	id: string;
	label: string;
	level: RiskLevel;
	words: string;
	reason: string;
	/** Where the cover verdict and the projection point different ways, one sentence on why. */
	explanation: string | null;
	/** Set when the projection rests on assumed inputs only. */
	indicative: string | null;
	/** 'measured' when the projection uses fronts measured on the structure. */
	basis: 'measured' | 'assumed' | null;
	/** In words: the measured fronts, their spread between locations, the band. */
	measuredWords: string | null;
	/** One line: the input that moves the share at the design life most. */
	sensitivity: string | null;
	n: number;
	areaM2: number | null;
	shareBelowCMin: number | null;
	cMinMm: number | null;
	atAges: ShareView[];
	atDesignLife: number | null;
	atDesignLifeShare: ShareView | null;
	curve: { years: number; share: number; low?: number; high?: number }[];
}

export interface AssessmentRiskView {
	assessmentId: number;
	title: string;
	approvedAt: string | null;
	engineer: string | null;
	recommendations: string | null;
	projected: boolean;
	designLifeYears: number;
	ageAtSurveyYears: number | null;
	targetBeta: number;
	level: RiskLevel;
	words: string;
	reason: string;
	shareBelowCMin: number | null;
	shareDepassivatedAtDesignLife: number | null;
	populations: PopulationRiskView[];
	/** Every input of the projections: value, measured / fitted / assumed, source. */
	provenance: InputProvenance[];
	/** The depassivation convention, in words. */
	convention: string;
}

export const CONVENTION_WORDS =
	'A bar counts as without protection when its cover is less than the depth the front has reached; a cover equal to it still counts as protected — the same “less than” as readings below the minimum cover.';

function shareView(a: RiskAtAge & { label: string }): ShareView {
	return {
		label: a.label,
		modelProbability: a.modelProbability,
		reliabilityIndex: a.reliabilityIndex,
		meetsTarget: a.meetsTarget,
		method: a.method,
		lessThan: a.lessThan ?? null,
		standardError: a.standardError ?? null,
		samples: a.samples ?? null,
		band: a.band ?? null
	};
}

function measuredWords(p: PopulationRisk): string | null {
	const m = p.measured;
	if (!m) return null;
	const fronts = m.locations
		.map((l) => l.frontAtDesignLifeMm)
		.filter((d): d is number => d !== null);
	const what =
		m.kind === 'chloride'
			? `${fronts.length} fitted chloride profiles`
			: `${m.locations.length} carbonation tests`;
	const spread =
		fronts.length > 1
			? ` Their fronts at the design life lie between ${Math.min(...fronts).toFixed(0)} and ${Math.max(...fronts).toFixed(0)} mm; that spread between locations is part of the band.`
			: ' One location: the spread between locations is not known.';
	const now = m.now
		? ` Now (${m.now.years} years): ${roundedPercent(m.now.share)} (band ${roundedPercent(m.now.low)}–${roundedPercent(m.now.high)}).`
		: '';
	const [lo, hi] = m.bootstrap.probabilities;
	return `Measured: from ${what} (${locationWords(m.locations)}).${spread}${now} At the design life: ${roundedPercent(m.atDesignLife.share)}, band ${roundedPercent(m.atDesignLife.low)}–${roundedPercent(m.atDesignLife.high)} (${lo * 100}–${hi * 100} % of a seeded bootstrap, ${m.bootstrap.replicates} replicates).`;
}

/** Inputs of every projection: a measured population's own rows, else its class's assumed ones. */
function provenanceOf(source: AssessedSource): InputProvenance[] {
	if (!source.projected) return [];
	const { annex } = source;
	const rows: InputProvenance[] = [];
	for (const p of annex.populations)
		if (p.measured && p.curve.length > 0) rows.push(...measuredProvenance(p, p.measured));
	for (const [exposure, parameters] of Object.entries(annex.parameters)) {
		const assumed = annex.populations.filter(
			(p) => p.exposureClass === exposure && !p.measured && p.curve.length > 0
		);
		if (assumed.length === 0) continue;
		const part = assumed.map((p) => p.label).join(', ');
		rows.push(...parameterProvenance(exposure, parameters, part));
	}
	return rows;
}

export function toRiskView(source: AssessedSource): AssessmentRiskView {
	const { header, annex, risk } = source;
	return {
		assessmentId: header.id,
		title: header.title,
		approvedAt: header.approvedAt,
		engineer: header.approvedBy ?? header.createdBy,
		recommendations: header.recommendations,
		projected: source.projected,
		designLifeYears: annex.designLifeYears,
		ageAtSurveyYears: annex.ageAtSurveyYears,
		targetBeta: annex.populations[0]?.targetBeta ?? 1.3,
		level: risk.level,
		words: risk.words,
		reason: risk.reason,
		shareBelowCMin: risk.shareBelowCMin,
		shareDepassivatedAtDesignLife: risk.shareDepassivatedAtDesignLife,
		provenance: provenanceOf(source),
		convention: CONVENTION_WORDS,
		// Worst first, then the largest area: the order an owner should read them in.
		populations: [...annex.populations].sort(worstFirst).map((p) => ({
			id: p.populationId,
			label: p.label,
			level: p.level,
			words: RISK_WORDS[p.level],
			reason: p.reason,
			explanation: verdictAndRiskWords(
				p.verdict,
				p.level,
				p.model,
				p.measured
					? {
							now: p.measured.now?.share ?? null,
							atDesignLife: p.measured.atDesignLife.share,
							locations: p.measured.locations.length
						}
					: null
			),
			indicative: p.model && p.curve.length > 0 && !p.measured ? indicativeWords(p.model) : null,
			basis: p.curve.length === 0 ? null : p.measured ? 'measured' : 'assumed',
			measuredWords: measuredWords(p),
			sensitivity: p.curve.length > 0 ? sensitivityWords(p.measured) : null,
			n: p.n,
			areaM2: p.areaM2,
			shareBelowCMin: p.shareBelowCMin,
			cMinMm: p.cMinMm,
			atAges: [
				...p.atAges,
				...(p.atDesignLife
					? [{ ...p.atDesignLife, label: `design life (${annex.designLifeYears} years)` }]
					: [])
			].map(shareView),
			atDesignLife: p.atDesignLife?.modelProbability ?? null,
			atDesignLifeShare: p.atDesignLife
				? shareView({ ...p.atDesignLife, label: `design life (${annex.designLifeYears} years)` })
				: null,
			curve: p.curve.map((c) => ({
				years: c.years,
				share: c.modelProbability,
				...(c.band ? { low: c.band.low, high: c.band.high } : {})
			}))
		}))
	};
}
