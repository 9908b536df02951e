/**
 * Words the pages and the report both print, written once so the two never speak differently,
 * and the domain's word lists (at the end). Browser-safe: no server imports.
 */
import type { RuleOutcome } from '$lib/analysis';
import { counted } from './format';

/** A rule's or population's verdict as people read it. */
export const VERDICT_WORDS: Record<RuleOutcome, string> = {
	pass: 'Complies',
	fail: 'Does not comply',
	'not-enough-data': 'Too few readings'
};

export const NOT_JUDGED = 'Not judged';

export const verdictWords = (outcome: RuleOutcome | null | undefined): string =>
	outcome ? (VERDICT_WORDS[outcome] ?? NOT_JUDGED) : NOT_JUDGED;

/** A survey's state as people read it. */
export const SURVEY_STATE_WORDS: Record<string, string> = {
	draft: 'draft (still being entered)',
	submitted: 'submitted, not yet approved',
	approved: 'approved',
	returned: 'returned to the surveyor for changes'
};

export const surveyStateWords = (state: string): string => SURVEY_STATE_WORDS[state] ?? state;

// Figures, counts and dates are formatted in format.ts.

/** What "depassivated" means, for an owner who is not a corrosion engineer (pages and report). */
export const DEPASSIVATED_WORDS =
	'“Without protection” (depassivated) means the concrete around the steel no longer keeps it from corroding: carbonation or chlorides have reached the bar. Corrosion can start from then on; it is not yet damage.';

const COUNT_WORDS = ['no', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine'];
/** counted() with small numbers in words, for sentences ("two areas"). */
const countWords = (n: number, one: string, many: string) =>
	counted(n, one, many).replace(/^\d+/, (digits) => COUNT_WORDS[n] ?? digits);

/** A member's low-cover areas as the owner's page and the report give them. */
export interface LowAreaSummary {
	memberLabel: string;
	populationLabel: string;
	/** Areas listed one by one (groupLowAreas in populations/lowCoverAreas.ts) and their m². */
	areaCount: number;
	areaM2: number;
	/** Areas too small to list (single cells, or under the minimum), counted together; absent in older snapshots. */
	spotCount?: number;
	spotM2?: number;
}

const squareMetres = (m2: number) => `${m2 >= 10 ? m2.toFixed(0) : m2.toFixed(1)} m²`;

/** "17 small spots, 4.3 m² in all", or '' when there are none. */
export function smallSpotWords(count: number | undefined, m2: number | undefined): string {
	if (!count) return '';
	return `${counted(count, 'small spot')}, ${squareMetres(m2 ?? 0)} in all`;
}

/** One member's low areas in a line: "one area, 7.8 m²; 17 small spots, 4.3 m² in all". */
export function memberLowAreaWords(m: LowAreaSummary): string {
	const spots = smallSpotWords(m.spotCount, m.spotM2);
	const areas =
		m.areaCount > 0 ? `${countWords(m.areaCount, 'area', 'areas')}, ${squareMetres(m.areaM2)}` : '';
	return [areas, spots].filter(Boolean).join('; ') || 'no area';
}

/**
 * "Treat first: member L2-BAY-07 (deck · XD3), two areas, 14 m²": the member with the most area
 * below c_min; null when no member has any.
 */
export function treatFirstWords(members: readonly LowAreaSummary[]): string | null {
	const first = [...members].sort((a, b) => b.areaM2 - a.areaM2)[0];
	if (!first) return null;
	if (first.areaCount === 0) {
		const spotted = members.filter((m) => m.spotCount);
		if (spotted.length === 0) return null;
		const m2 = spotted.reduce((s, m) => s + (m.spotM2 ?? 0), 0);
		const count = spotted.reduce((s, m) => s + (m.spotCount ?? 0), 0);
		return (
			`No area large enough to treat first; ${countWords(spotted.length, 'member has', 'members have')} ` +
			`${smallSpotWords(count, m2)} below c_min.`
		);
	}
	const m2 = squareMetres(first.areaM2);
	const spots = smallSpotWords(first.spotCount, first.spotM2);
	const others = members.filter((m) => m !== first && m.areaCount > 0).length;
	const rest =
		others > 0 ? `; ${countWords(others, 'other member has', 'other members have')} low areas` : '';
	return (
		`Treat first: member ${first.memberLabel} (${first.populationLabel}), ` +
		`${countWords(first.areaCount, 'area', 'areas')} below c_min, ${m2}` +
		`${spots ? ` (and ${spots})` : ''}${rest}.`
	);
}

/** The rule sets (src/lib/analysis/rules/ruleSets.ts) as people read them; the key stays in URLs. */
export const RULE_SET_WORDS: Record<string, string> = {
	'en-statistical': 'statistical acceptance: characteristic cover, share below c_min, excess cover',
	'aci-tolerance': 'tolerance on each reading (ACI 117), excess cover',
	'strict-minimum': 'no reading below c_min, excess cover',
	'full-review': 'every rule, for a review'
};

export const ruleSetWords = (name: string): string => RULE_SET_WORDS[name] ?? name;

/*
 * The domain's word lists: the values the database's enum columns hold and every form, API and
 * filter accepts, written once for the server, the pages and the API. A migration keeps its own
 * copy of a list as it was when it ran (history must not change with the live list);
 * tests/integration/migrations.test.ts checks that the migrated schema's enums are these lists.
 */

export const ROLES = ['admin', 'engineer', 'surveyor', 'owner', 'researcher'] as const;
export type Role = (typeof ROLES)[number];

/** The roles as people read them, in the order of ROLES. */
export const ROLE_OPTIONS = [
	{ value: 'admin', label: 'Admin — everything, people and roles included' },
	{ value: 'engineer', label: 'Engineer — assessments and approval' },
	{ value: 'surveyor', label: 'Surveyor — surveys and readings' },
	{ value: 'owner', label: 'Owner — approved results of shared assets' },
	{ value: 'researcher', label: 'Researcher — anonymised data' }
] as const satisfies readonly { value: Role; label: string }[];

/** Where a member's required cover comes from: a design code's table or the project's own. */
export const DESIGN_CODES = ['EN 1992-1-1', 'ACI 318', 'project'] as const;
export const MEMBER_TYPES = ['slab', 'beam', 'column', 'wall', 'footing', 'deck', 'other'] as const;
export const MEMBER_FACES = ['top', 'bottom', 'side'] as const;
/** EN 1992-1-1 Table 4.1's exposure classes. */
export const EXPOSURE_CLASSES_EN = [
	'X0',
	'XC1',
	'XC2',
	'XC3',
	'XC4',
	'XD1',
	'XD2',
	'XD3',
	'XS1',
	'XS2',
	'XS3'
] as const;
/** What a chloride content is a percentage of, by mass (intake/measurements.ts converts to binder). */
export const CHLORIDE_BASES = ['binder', 'concrete'] as const;

export const SURVEY_STATES = ['draft', 'submitted', 'approved', 'returned'] as const;
export const ASSESSMENT_STATES = ['draft', 'approved', 'superseded'] as const;
/** What an import's file holds. */
export const IMPORT_KINDS = ['readings', 'carbonation', 'chloride'] as const;
export const IMPORT_STATES = [
	'pending',
	'running',
	'completed',
	'failed',
	'cancelled',
	'undone'
] as const;
export const ATTACHMENT_KINDS = ['photo', 'drawing', 'meter-file', 'other'] as const;
/** What a device sends from site in one batch. */
export const SYNC_KINDS = ['entries', 'photo'] as const;

/** A population's risk level in our own plain words; the server's risk/levels.ts assigns them. */
export const RISK_LEVELS = ['act-now', 'plan-repairs', 'keep-watching', 'low-concern'] as const;
export type RiskLevel = (typeof RISK_LEVELS)[number] | 'not-judged';

export const RISK_WORDS: Record<RiskLevel, string> = {
	'act-now': 'Act now',
	'plan-repairs': 'Plan repairs',
	'keep-watching': 'Keep watching',
	'low-concern': 'Low concern',
	'not-judged': 'Not judged'
};
/** A custom population as an assessment's snapshot carries it, the fields read for words. */
export interface CarriedCustomLike {
	custom: { name: string; splitFromLabel: string | null };
	populations: {
		key: { rest?: boolean };
		members: { label: string }[];
		assessment: { verdict: RuleOutcome } | null;
	}[];
}

/** "L2-BAY-04", "L2-BAY-04 and L2-BAY-05", "A, B, C and 4 more". */
function memberList(labels: readonly string[]): string {
	if (labels.length <= 1) return labels[0] ?? 'no member';
	const shown = labels.length > 4 ? labels.slice(0, 3) : labels.slice(0, -1);
	const last = labels.length > 4 ? `${labels.length - 3} more` : labels[labels.length - 1];
	return `${shown.join(', ')} and ${last}`;
}

/**
 * A population the engineer made, in one sentence for the owner: "The engineer judged bay
 * L2-BAY-04 apart from the rest of deck · XD3 (“Low bay”): does not comply; the rest of deck ·
 * XD3 without it: complies."
 */
export function customPopulationWords(c: CarriedCustomLike): string {
	const chosen = c.populations.find((p) => !p.key.rest);
	const rest = c.populations.find((p) => p.key.rest);
	const labels = chosen?.members.map((m) => m.label) ?? [];
	const who = `${labels.length === 1 ? 'member' : 'members'} ${memberList(labels)}`;
	const verdict = (p: typeof chosen) => verdictWords(p?.assessment?.verdict).toLowerCase();
	if (c.custom.splitFromLabel) {
		const source = c.custom.splitFromLabel;
		const restWords = rest
			? `; the rest of ${source} without ${labels.length === 1 ? 'it' : 'them'}: ${verdict(rest)}`
			: '';
		return `The engineer judged ${who} apart from the rest of ${source} (“${c.custom.name}”): ${verdict(chosen)}${restWords}.`;
	}
	return `The engineer judged ${who} together as “${c.custom.name}”: ${verdict(chosen)}.`;
}

/** What a saved assessment's check-hole calibration of one population holds (snapshot shape). */
export interface CalibratedPopulationLike {
	label: string;
	calibration: {
		asRead: RuleOutcome | null;
		calibrated: { calibration: { n: number }; assessment: { verdict: RuleOutcome } } | null;
		problem: string | null;
	};
}

/**
 * A population's check-hole calibration in one sentence for the owner: "deck · XD3: the cover
 * meter was checked against 4 holes drilled to the steel; with its readings corrected by them
 * the outcome stays: does not comply."
 */
export function calibrationOwnerWords({ label, calibration: c }: CalibratedPopulationLike): string {
	if (!c.calibrated)
		return `${label}: the cover meter could not be checked here. ${c.problem ?? ''}`.trim();
	const holes = counted(c.calibrated.calibration.n, 'hole');
	const before = verdictWords(c.asRead).toLowerCase();
	const after = verdictWords(c.calibrated.assessment.verdict).toLowerCase();
	const outcome = before === after ? `stays: ${after}` : `changes from ${before} to ${after}`;
	return `${label}: the cover meter was checked against ${holes} drilled to the steel; with its readings corrected by them the outcome ${outcome}.`;
}

/** What the owner's list of calibrated populations means (the owner's page). */
export const CALIBRATION_OWNER_WORDS =
	'Measured: the cover at each hole, drilled down to the bar. The verdicts below stay those of the meter’s readings; the engineer’s report gives the corrected figures and how they were worked out.';

/** Why the custom populations stand apart from the groups (the owner's page and the report). */
export const CUSTOM_APART_WORDS =
	'Judged by the same engine in addition to the assessment’s populations; each member is counted once, in its own population, in the risk figures.';
