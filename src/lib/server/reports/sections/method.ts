/** Method statement: meter and its verification, populations, statistics and rules, engine. */
import { CALIBRATION_METHOD_WORDS } from '$lib/analysis';
import { describeParameters, type AssessedSource } from '$lib/server/risk';
import type { ReportWriter } from '../layout';
import { mm, num } from '$lib/format';

export function methodStatement(w: ReportWriter, source: AssessedSource): void {
	const { snapshot, annex } = source;
	w.doc.addPage();
	w.heading('Method statement');
	const surveys = snapshot.surveys;
	const meterNames = [
		...new Set(surveys.map((s) => [s.meterMake, s.meterSerial].filter(Boolean).join(', serial ')))
	];
	const v = snapshot.meter.verification;
	w.keyValues([
		['Cover meter', meterNames.join('; ') || 'not recorded'],
		['Calibration', surveys.map((s) => s.meterCalibration ?? 'not recorded').join('; ')],
		[
			'Verification',
			v
				? `${v.n} holes: measured = ${num(v.interceptMm, 2)} mm + ${num(v.slope, 3)} × reading; bias ${mm(v.biasMm)}; residual SD ${mm(v.residualSdMm)}; uncertainty ±${mm(v.uncertaintyMm)}`
				: (snapshot.meter.note ?? 'no verification')
		],
		['Readings', `${snapshot.readingCount} readings in ${snapshot.populations.length} populations`],
		['Engine version', snapshot.engineVersion]
	]);
	const first = snapshot.populations.find((p) => p.assessment)?.assessment;
	w.heading('Statistics and rules', 2);
	w.paragraph(
		'Readings are grouped into populations of like members: member type × exposure class. Each population is judged as a whole against the minimum cover c_min of its governing member.'
	);
	if (first) {
		const o = first.options;
		w.paragraph(
			`Characteristic cover: lower ${o.fractileP * 100} % fractile by the ${o.characteristicMethod} method at ${o.confidence * 100} % confidence; percentiles by Hyndman–Fan type ${o.percentileType}; model ${o.model}; rule set ${o.ruleSet}; at least ${o.minSampleSize} readings for each statistical rule.`
		);
	}
	if (snapshot.calibration === 'apply') {
		w.heading('Check-hole calibration', 2);
		w.paragraph(
			`Each population is also judged through its members' check holes, shown beside its verdict under Populations; the verdict stays that of the readings as the meter logged them. ${CALIBRATION_METHOD_WORDS}`
		);
	}
	w.heading('Durability models', 2);
	w.paragraph(
		'Carbonation classes (XC) use x = k·√t; chloride classes (XD, XS) use the error-function solution of Fick’s second law. The share depassivated combines the fitted cover distribution with the model’s scatter (closed form when both are normal, otherwise seeded Monte Carlo); the reliability index β = −Φ⁻¹(P) is compared with the target.'
	);
	const entries = Object.entries(annex.parameters);
	if (entries.length === 0)
		w.paragraph('No durability parameters were entered with this assessment.');
	for (const [exposure, p] of entries) w.paragraph(describeParameters(exposure, p));
	w.paragraph(
		`Monte Carlo: ${annex.simulation.samples} samples, seed ${annex.simulation.seed}. Ages are years since construction; the age at the survey is ${annex.ageAtSurveyYears ?? 'unknown'} years.`
	);
}
