/** A table and a histogram per population. */
import type { AssessedSource } from '$lib/server/risk';
import { histogramDescription } from '$lib/charts/histogram';
import { verdictWords } from '$lib/words';
import { histogramPng } from '../charts';
import type { ReportWriter } from '../layout';
import { mm, percent } from '$lib/format';

export function populationSections(w: ReportWriter, source: AssessedSource): void {
	w.doc.addPage();
	w.heading('Populations');
	for (const p of source.snapshot.populations) {
		w.heading(p.label, 2);
		const a = p.assessment;
		if (!a) {
			w.paragraph(p.problem ?? 'Not judged.');
			continue;
		}
		w.paragraph(
			`Verdict: ${verdictWords(a.verdict)}. Members: ${p.members.map((m) => m.label).join(', ')}.`,
			{ bold: true }
		);
		w.table(
			[
				{ title: 'n', width: 0.1, align: 'right' },
				{ title: 'Mean', width: 0.13, align: 'right' },
				{ title: 'SD', width: 0.12, align: 'right' },
				{ title: 'Characteristic', width: 0.17, align: 'right' },
				{ title: 'c_min', width: 0.12, align: 'right' },
				{ title: 'Below c_min', width: 0.18, align: 'right' },
				{ title: 'Model', width: 0.18 }
			],
			[
				[
					String(a.description.n),
					mm(a.description.meanMm),
					mm(a.description.sdMm),
					mm(a.characteristic.chosenMm),
					mm(a.requirement.cMinMm, 0),
					percent(a.fractionBelowCMin.empirical),
					a.chosenModel
				]
			]
		);
		w.table(
			[
				{ title: 'Rule', width: 0.3 },
				{ title: 'Outcome', width: 0.15 },
				{ title: 'Reason', width: 0.55 }
			],
			a.rules.map((r) => [r.title, verdictWords(r.outcome), r.reason])
		);
		for (const warning of a.warnings) w.paragraph(`Note: ${warning}`, { size: 9 });
		if (a.charts) {
			w.image(histogramPng(a), `${p.label}. ${histogramDescription(a)}`);
		}
	}
}
