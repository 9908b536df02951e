/** A table and a histogram per population. */
import { calibrationLineWords, type PopulationAssessment } from '$lib/analysis';
import type { CalibrationOutcome } from '$lib/server/populations';
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
		if (p.calibration) calibrationBlock(w, a, p.calibration);
		if (a.charts) {
			w.image(histogramPng(a), `${p.label}. ${histogramDescription(a)}`);
		}
	}
}

/**
 * The population through its check-hole calibration beside the verdict as read (the method is
 * stated once, in the method statement).
 */
function calibrationBlock(
	w: ReportWriter,
	asRead: PopulationAssessment,
	outcome: CalibrationOutcome
) {
	w.paragraph(outcome.sentence, { bold: true });
	const c = outcome.calibrated;
	if (!c) return;
	const row = (title: string, a: PopulationAssessment, predicted: number | null) => [
		title,
		mm(a.characteristic.chosenMm),
		percent(a.fractionBelowCMin.empirical),
		percent(a.fractionBelowCMin.upperBound),
		predicted === null ? '—' : percent(predicted),
		verdictWords(a.verdict)
	];
	w.table(
		[
			{ title: 'Covers', width: 0.15 },
			{ title: 'Characteristic', width: 0.17, align: 'right' },
			{ title: 'Below c_min', width: 0.14, align: 'right' },
			{ title: 'Upper bound', width: 0.14, align: 'right' },
			{ title: 'Predicted below', width: 0.17, align: 'right' },
			{ title: 'Verdict', width: 0.23 }
		],
		[row('As logged', asRead, null), row('Calibrated', c.assessment, c.predictiveShareBelowCMin)]
	);
	w.paragraph(calibrationLineWords(c), { size: 9 });
}
