/** What the pages get: plain figures of an assessed source, without the snapshot's bulk. */
import { RISK_WORDS, type RiskLevel } from './levels';
import type { AssessedSource } from './portfolio';
import { worstFirst } from './summary';
import {
	indicativeWords,
	parameterProvenance,
	verdictAndRiskWords,
	type InputProvenance
} from './provenance';

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
	n: number;
	areaM2: number | null;
	shareBelowCMin: number | null;
	cMinMm: number | null;
	atAges: {
		label: string;
		modelProbability: number;
		reliabilityIndex: number | null;
		meetsTarget: boolean;
	}[];
	atDesignLife: number | null;
	curve: { years: number; share: number }[];
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
		provenance: source.projected
			? Object.entries(annex.parameters).flatMap(([exposure, p]) =>
					parameterProvenance(exposure, p)
				)
			: [],
		// Worst first, then the largest area: the order an owner should read them in.
		populations: [...annex.populations].sort(worstFirst).map((p) => ({
			id: p.populationId,
			label: p.label,
			level: p.level,
			words: RISK_WORDS[p.level],
			reason: p.reason,
			explanation: verdictAndRiskWords(p.verdict, p.level, p.model),
			indicative: p.model && p.curve.length > 0 ? indicativeWords(p.model) : null,
			n: p.n,
			areaM2: p.areaM2,
			shareBelowCMin: p.shareBelowCMin,
			cMinMm: p.cMinMm,
			atAges: [
				...p.atAges,
				...(p.atDesignLife
					? [{ ...p.atDesignLife, label: `design life (${annex.designLifeYears} years)` }]
					: [])
			].map((a) => ({
				label: a.label,
				modelProbability: a.modelProbability,
				reliabilityIndex: a.reliabilityIndex,
				meetsTarget: a.meetsTarget
			})),
			atDesignLife: p.atDesignLife?.modelProbability ?? null,
			curve: p.curve.map((c) => ({ years: c.years, share: c.modelProbability }))
		}))
	};
}
