/** The risk section: levels, projections at the owner's ages, β against the target, the curve. */
import { RISK_WORDS, toRiskView, type AssessedSource } from '$lib/server/risk';
import { riskCurvePng } from '../charts';
import type { ReportWriter } from '../layout';
import { num, pct } from '../text';

export function riskSection(w: ReportWriter, source: AssessedSource): void {
	const { annex } = source;
	w.doc.addPage();
	w.heading('Risk of corrosion over time');
	if (!source.projected) {
		w.paragraph(
			'No durability parameters were entered with this assessment: levels rest on the cover rules alone and nothing is projected.'
		);
	}
	for (const p of annex.populations) {
		w.heading(`${p.label}: ${RISK_WORDS[p.level]}`, 2);
		w.paragraph(p.reason);
		if (p.atAges.length === 0) continue;
		const rows = [
			...p.atAges,
			...(p.atDesignLife
				? [{ ...p.atDesignLife, label: `design life (${annex.designLifeYears} years)` }]
				: [])
		];
		w.table(
			[
				{ title: 'Age', width: 0.28 },
				{ title: 'Readings reached', width: 0.18, align: 'right' },
				{ title: 'Model share', width: 0.16, align: 'right' },
				{ title: 'β', width: 0.12, align: 'right' },
				{ title: `Meets β ${p.targetBeta}`, width: 0.14 },
				{ title: 'Method', width: 0.12 }
			],
			rows.map((r) => [
				r.label,
				pct(r.empiricalShare),
				pct(r.modelProbability),
				num(r.reliabilityIndex),
				r.meetsTarget ? 'yes' : 'no',
				r.method === 'monte-carlo' ? 'simulated' : 'closed form'
			])
		);
	}
	// The owner's page's order and series (worst first), so each part has the same colour there.
	const view = toRiskView(source);
	if (view.provenance.length > 0) {
		w.heading('What the projections rest on', 2);
		w.paragraph(
			'Each input is measured on this structure, fitted to measurements, or assumed. Chloride thresholds and ageing depend on the binder and are uncertain; the governing code and a licensed engineer decide what to use.',
			{ size: 9 }
		);
		w.table(
			[
				{ title: 'Class', width: 0.08 },
				{ title: 'Input', width: 0.26 },
				{ title: 'Value', width: 0.16, align: 'right' },
				{ title: 'Basis', width: 0.1 },
				{ title: 'Source', width: 0.4 }
			],
			view.provenance.map((r) => [r.exposureClass, r.input, r.value, r.basis, r.source])
		);
	}
	const withCurves = view.populations.filter((p) => p.curve.length > 0);
	if (withCurves.length > 0) {
		w.image(
			riskCurvePng(withCurves, annex.designLifeYears),
			`Projected share depassivated (%) against the age of the structure (years) for each population; the dashed vertical line marks the design life of ${annex.designLifeYears} years. The tables above give the same figures.`
		);
	}
}
