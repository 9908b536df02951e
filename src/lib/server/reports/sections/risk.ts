/** The risk section: levels, projections at the owner's ages, β against the target, the curve. */
import { RISK_WORDS, toRiskView, type AssessedSource } from '$lib/server/risk';
import { betaWords, METHOD_WORDS, shareWords } from '$lib/components/risk/format';
import { PROFILE_CHART, chlorideProfilePng, riskCurvePng } from '../charts';
import type { ReportWriter } from '../layout';
import { percent } from '$lib/format';
import { chlorideProfilesSection } from './profiles';

type RiskView = ReturnType<typeof toRiskView>;

function provenanceTable(w: ReportWriter, view: RiskView): void {
	if (view.provenance.length === 0) return;
	w.heading('What the projections rest on', 2);
	w.paragraph(
		'Each input is measured on this structure, fitted to measurements, or assumed. Chloride thresholds and ageing depend on the binder and are uncertain; the governing code and a licensed engineer decide what to use.',
		{ size: 9 }
	);
	w.table(
		[
			{ title: 'Part', width: 0.14 },
			{ title: 'Input', width: 0.2 },
			{ title: 'Value', width: 0.18, align: 'right' },
			{ title: 'Basis', width: 0.11 },
			{ title: 'Source', width: 0.37 }
		],
		// The part's label names its exposure class already.
		view.provenance.map((r) => [r.part, r.input, r.value, r.basis, r.source])
	);
}

export function riskSection(w: ReportWriter, source: AssessedSource): void {
	const { annex } = source;
	// The owner's page's order and series (worst first), so each part has the same colour there.
	const view = toRiskView(source);
	w.doc.addPage();
	w.heading('Risk of corrosion over time');
	if (!source.projected) {
		w.paragraph(
			'No durability parameters were entered with this assessment: levels rest on the cover rules alone and nothing is projected.'
		);
	} else {
		w.paragraph(view.convention, { size: 9 });
	}
	for (const p of annex.populations) {
		const shown = view.populations.find((v) => v.id === p.populationId);
		w.heading(`${p.label}: ${RISK_WORDS[p.level]}`, 2);
		w.paragraph(p.reason);
		for (const words of [
			shown?.explanation,
			shown?.indicative,
			shown?.measuredWords,
			shown?.sensitivity
		])
			if (words) w.paragraph(words, { size: 9 });
		if (!shown || shown.atAges.length === 0) continue;
		w.table(
			[
				{ title: 'Age', width: 0.25 },
				{ title: 'Projected share', width: 0.29, align: 'right' },
				{ title: 'β', width: 0.12, align: 'right' },
				{ title: `Meets β ${p.targetBeta}`, width: 0.13 },
				{ title: 'Method', width: 0.21 }
			],
			shown.atAges.map((r) => [
				r.label,
				shareWords(r),
				betaWords(r),
				r.meetsTarget ? 'yes' : 'no',
				METHOD_WORDS[r.method] ?? r.method
			])
		);
		if (p.measured === undefined || p.measured === null)
			w.paragraph(
				`Readings reached by the mean front at the design life: ${percent(p.atDesignLife?.empiricalShare)}.`,
				{ size: 8 }
			);
	}
	provenanceTable(w, view);
	const withCurves = view.populations.filter((p) => p.curve.length > 0);
	if (withCurves.length > 0) {
		w.image(
			riskCurvePng(withCurves, annex.designLifeYears),
			`Projected share depassivated (%) against the age of the structure (years) for each population; the dashed vertical line marks the design life of ${annex.designLifeYears} years. A shaded area about a line is the 5–95 % band of a projection from measured fronts (seeded bootstrap). The tables above give the same figures.`
		);
	}
	chlorideProfilesSection(w, annex, (data) => ({
		png: chlorideProfilePng(data),
		aspect: PROFILE_CHART.height / PROFILE_CHART.width
	}));
}
