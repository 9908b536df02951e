/**
 * The compliance rules. Each answers pass, fail or not enough data with a one-sentence reason.
 */
import { judgedCharacteristic } from '../characteristicCover';
import { clopperPearsonUpper } from '../clopperPearson';
import { countAtOrBelowCounted, countBelowCounted, percentileCounted } from '../countedSample';
import { aciCoverToleranceMm } from '../requirements/aci';
import { allowedFractionOf, roundMm } from '../requirements/requirement';
import { formatCover } from '../units';
import type { RuleContext, RuleId, RuleResult } from './ruleTypes';

const pct = (x: number): string => `${(100 * x).toFixed(1)} %`;

function tooFew(id: RuleId, title: string, ctx: RuleContext): RuleResult | null {
	const n = ctx.description.n;
	if (n >= ctx.minSampleSize) return null;
	const reason = `Only ${n} readings were taken; this check needs at least ${ctx.minSampleSize}.`;
	return {
		id,
		title,
		outcome: 'not-enough-data',
		reason,
		figures: { n, minSampleSize: ctx.minSampleSize }
	};
}

/** Every reading ≥ c_min (deterministic; any number of readings). */
export function everyReadingMin(ctx: RuleContext): RuleResult {
	const { cMinMm } = ctx.requirement;
	const below = countBelowCounted(ctx.sample, cMinMm);
	const minMm = ctx.description.minMm;
	const c = formatCover(cMinMm, ctx.unit);
	return {
		id: 'every-reading-min',
		title: 'Every reading at least the minimum cover',
		outcome: below === 0 ? 'pass' : 'fail',
		reason:
			below === 0
				? `All ${ctx.description.n} readings are at least the minimum cover of ${c}.`
				: `${below} of ${ctx.description.n} readings are below the minimum cover of ${c} (lowest ${formatCover(minMm, ctx.unit)}).`,
		figures: { cMinMm, countBelow: below, n: ctx.description.n, minMm }
	};
}

/** Characteristic cover by the chosen method and model ≥ c_min. */
export function characteristicMin(ctx: RuleContext): RuleResult {
	const title = 'Characteristic cover at least the minimum cover';
	const early = tooFew('characteristic-min', title, ctx);
	if (early) return early;
	const { cMinMm } = ctx.requirement;
	const fit = ctx.model === 'lognormal' ? ctx.models.lognormal : ctx.models.normal;
	const judged = judgedCharacteristic(
		ctx.characteristic,
		ctx.method,
		ctx.model,
		fit?.rejected === true
	);
	const valueMm = judged.valueMm;
	const p = ctx.characteristic.p;
	const pass = valueMm >= cMinMm;
	const caveat = judged.empiricalTaken
		? ' (the model does not fit, so the lower empirical figure counts)'
		: '';
	return {
		id: 'characteristic-min',
		title,
		outcome: pass ? 'pass' : 'fail',
		reason: `The cover that ${pct(1 - p)} of the structure reaches is ${formatCover(valueMm, ctx.unit)}${caveat}, ${pass ? 'at least' : 'below'} the minimum of ${formatCover(cMinMm, ctx.unit)}.`,
		figures: {
			characteristicMm: valueMm,
			cMinMm,
			p,
			method: ctx.method,
			model: ctx.model,
			confidence: ctx.characteristic.confidence
		}
	};
}

/** Clopper–Pearson upper bound (γ) on the share below c_min ≤ the allowed share. */
export function fractionBelowMin(ctx: RuleContext): RuleResult {
	const title = 'Share below the minimum cover within the allowance';
	const early = tooFew('fraction-below-min', title, ctx);
	if (early) return early;
	const f = ctx.fractionBelowCMin;
	const allowed = allowedFractionOf(ctx.requirement);
	const pass = f.upperBound <= allowed;
	return {
		id: 'fraction-below-min',
		title,
		outcome: pass ? 'pass' : 'fail',
		reason: `${f.count} of ${f.n} readings (${pct(f.empirical)}) are below ${formatCover(f.limitMm, ctx.unit)}; with ${pct(f.confidence)} confidence the true share is at most ${pct(f.upperBound)}, ${pass ? 'within' : 'more than'} the ${pct(allowed)} allowed.`,
		figures: {
			cMinMm: f.limitMm,
			count: f.count,
			n: f.n,
			fraction: f.empirical,
			upperBound: f.upperBound,
			allowedFraction: allowed,
			confidence: f.confidence
		}
	};
}

/** ACI 117: every reading ≥ specified cover − tolerance (from member depth, else Δc_dev). */
export function aciTolerance(ctx: RuleContext): RuleResult {
	const { cNomMm, memberDepthMm, deltaCDevMm } = ctx.requirement;
	const toleranceMm = memberDepthMm ? aciCoverToleranceMm(cNomMm, memberDepthMm) : deltaCDevMm;
	const limitMm = roundMm(cNomMm - toleranceMm);
	const below = countBelowCounted(ctx.sample, limitMm);
	const n = ctx.description.n;
	return {
		id: 'aci-tolerance',
		title: 'Every reading within the cover tolerance (ACI 117)',
		outcome: below === 0 ? 'pass' : 'fail',
		reason:
			below === 0
				? `All ${n} readings are within the tolerance of ${formatCover(toleranceMm, ctx.unit)} under the specified ${formatCover(cNomMm, ctx.unit)}.`
				: `${below} of ${n} readings are more than ${formatCover(toleranceMm, ctx.unit)} under the specified cover of ${formatCover(cNomMm, ctx.unit)}.`,
		figures: { cNomMm, toleranceMm, limitMm, countBelow: below, n }
	};
}

/**
 * Upper fractile (1 − p, empirical, of the chosen percentile type) ≤ c_nom + Δplus; only when
 * Δplus is given. The Clopper–Pearson bound on the share above the limit is at the chosen γ.
 */
export function excessCover(ctx: RuleContext): RuleResult {
	const title = 'Cover not more than the upper tolerance allows';
	const early = tooFew('excess-cover', title, ctx);
	if (early) return early;
	const limitMm = roundMm(ctx.requirement.cNomMm + (ctx.requirement.deltaPlusMm ?? 0));
	const p = ctx.characteristic.p;
	const upperMm = percentileCounted(ctx.sample, 1 - p, ctx.percentileType);
	const above = ctx.sample.n - countAtOrBelowCounted(ctx.sample, limitMm);
	const pass = upperMm <= limitMm;
	return {
		id: 'excess-cover',
		title,
		outcome: pass ? 'pass' : 'fail',
		reason: `${pct(p)} of the readings exceed ${formatCover(upperMm, ctx.unit)}, ${pass ? 'within' : 'above'} the upper limit of ${formatCover(limitMm, ctx.unit)} (c_nom + Δplus).`,
		figures: {
			upperFractileMm: upperMm,
			limitMm,
			countAbove: above,
			upperBoundAbove: clopperPearsonUpper(above, ctx.sample.n, ctx.characteristic.confidence),
			percentileType: ctx.percentileType,
			confidence: ctx.characteristic.confidence
		}
	};
}
