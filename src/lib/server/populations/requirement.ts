/**
 * The requirement a group of members is judged against, from the members' specified values.
 *
 * Rule (documented in docs/populations.md): when the members of a group were specified with
 * different covers, the group is judged against the governing member — the one with the largest
 * c_min (ties: the largest c_nom) — and its c_nom, Δc_dev and Δplus, and the result says so.
 * Judging the whole group against the largest c_min never flatters the members specified lower.
 */
import type { CodeSystem, CoverRequirement } from '$lib/analysis';
import type { MemberSpec } from './gather';

export interface GroupRequirement {
	requirement: CoverRequirement;
	/** Label of the member whose specified values govern. */
	governingMember: string;
	/** True when the members' c_min or c_nom differ. */
	mixed: boolean;
	/** A sentence for the page when mixed; null otherwise. */
	note: string | null;
	/** The distinct c_min values in the group (mm), ascending. */
	cMinValuesMm: number[];
}

const CODE_SYSTEM: Record<MemberSpec['requirementSource'], CodeSystem> = {
	'EN 1992-1-1': 'EN',
	'ACI 318': 'ACI',
	project: 'project'
};

function governing(members: readonly MemberSpec[]): MemberSpec {
	return members.reduce((best, m) =>
		m.cMinMm > best.cMinMm || (m.cMinMm === best.cMinMm && m.cNomMm > best.cNomMm) ? m : best
	);
}

const distinct = (values: number[]) => [...new Set(values)].sort((a, b) => a - b);

/** The governing requirement of a group (members must not be empty). */
export function groupRequirement(members: readonly MemberSpec[]): GroupRequirement {
	if (members.length === 0) throw new Error('groupRequirement needs at least 1 member');
	const g = governing(members);
	const cMinValuesMm = distinct(members.map((m) => m.cMinMm));
	const cNomValues = distinct(members.map((m) => m.cNomMm));
	const mixed = cMinValuesMm.length > 1 || cNomValues.length > 1;
	return {
		requirement: {
			cMinMm: g.cMinMm,
			cNomMm: g.cNomMm,
			deltaCDevMm: g.deltaCDevMm,
			deltaPlusMm: g.deltaPlusMm,
			codeSystem: CODE_SYSTEM[g.requirementSource],
			memberDepthMm: g.memberDepthMm,
			basis: `${g.requirementSource}, as specified for member ${g.label}`
		},
		governingMember: g.label,
		mixed,
		note: mixed
			? `The members were specified with different covers (c_min ${cMinValuesMm.join(', ')} mm; ` +
				`c_nom ${cNomValues.join(', ')} mm); the group is judged against the largest, ` +
				`member ${g.label}'s c_min ${g.cMinMm} mm.`
			: null,
		cMinValuesMm
	};
}
