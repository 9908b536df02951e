/**
 * An asset's standing from its populations' risks, and the ranked "look at first" list.
 * Asset figures are reading-weighted over the judged populations (documented in
 * docs/owner-view.md); the asset's level is its worst population's.
 */
import type { PopulationRisk } from './compute';
import { RISK_SEVERITY, RISK_WORDS, type RiskLevel } from './levels';

export interface AssetRisk {
	level: RiskLevel;
	words: string;
	reason: string;
	/** Readings below c_min over all judged readings. */
	shareBelowCMin: number | null;
	/** Reading-weighted model probability of depassivation at the design life; null: no model. */
	shareDepassivatedAtDesignLife: number | null;
	/** Scanned area (m²) of the populations at the asset's level; null when unknown. */
	areaAtLevelM2: number | null;
}

function weighted(
	populations: readonly PopulationRisk[],
	value: (p: PopulationRisk) => number | null
) {
	let sum = 0;
	let n = 0;
	for (const p of populations) {
		const v = value(p);
		if (v === null) continue;
		sum += v * p.n;
		n += p.n;
	}
	return n > 0 ? sum / n : null;
}

export function worstFirst(a: PopulationRisk, b: PopulationRisk): number {
	return (
		RISK_SEVERITY[b.level] - RISK_SEVERITY[a.level] ||
		(b.areaM2 ?? 0) - (a.areaM2 ?? 0) ||
		a.label.localeCompare(b.label)
	);
}

export function assetRisk(populations: readonly PopulationRisk[]): AssetRisk {
	const ranked = [...populations].sort(worstFirst);
	const worst = ranked[0];
	if (!worst) {
		return {
			level: 'not-judged',
			words: RISK_WORDS['not-judged'],
			reason: 'No population was judged.',
			shareBelowCMin: null,
			shareDepassivatedAtDesignLife: null,
			areaAtLevelM2: null
		};
	}
	const atLevel = ranked.filter((p) => p.level === worst.level);
	const areas = atLevel.map((p) => p.areaM2);
	return {
		level: worst.level,
		words: RISK_WORDS[worst.level],
		reason: `${worst.label}: ${worst.reason}`,
		shareBelowCMin: weighted(populations, (p) => p.shareBelowCMin),
		shareDepassivatedAtDesignLife: weighted(
			populations,
			(p) => p.atDesignLife?.modelProbability ?? null
		),
		areaAtLevelM2: areas.some((a) => a === null)
			? null
			: areas.reduce<number>((s, a) => s + (a ?? 0), 0)
	};
}
