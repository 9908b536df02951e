/**
 * The histogram of a population's covers against its limits: one configuration for the
 * population page (chart.js in the browser) and the report (chart.js on the server).
 */
import { mm } from '$lib/format';
import type { ChartConfiguration } from 'chart.js';
import type { PopulationAssessment } from '$lib/analysis';
import { limitLines, lineAnnotations, toleranceBand } from './limits';
import { axisTicks, axisTitle, legendLabels, PAGE_LOOK, type ChartLook } from './look';
import { OKABE_ITO } from './palette';

/** A model's curve is drawn only where the goodness-of-fit test did not reject it. */
export function chosenModelFits(assessment: PopulationAssessment): boolean {
	const fit = assessment.models[assessment.chosenModel];
	return fit !== null && fit !== undefined && fit.rejected === false;
}

export function histogramConfig(
	assessment: PopulationAssessment,
	look: ChartLook = PAGE_LOOK
): ChartConfiguration<'bar' | 'line'> {
	const charts = assessment.charts!;
	const lines = limitLines(assessment.requirement, assessment.characteristic.chosenMm);
	const binWidthMm = charts.histogram[0].toMm - charts.histogram[0].fromMm;
	// Density (1/mm) to expected count per bin: n × bin width, so the curve sits on the bars.
	const curve = chosenModelFits(assessment)
		? charts.curves
				.filter((c) => c.model === assessment.chosenModel)
				.map((c) => ({ x: c.coverMm, y: c.pdf * assessment.description.n * binWidthMm }))
		: [];
	// Every limit line inside the axis: c_min is drawn even when no reading comes near it.
	const limitValues = lines.map((l) => l.valueMm).filter((v) => Number.isFinite(v));
	const xMin = Math.floor(Math.min(charts.histogram[0].fromMm, ...limitValues) - binWidthMm);
	const xMax = Math.ceil(
		Math.max(charts.histogram[charts.histogram.length - 1].toMm, ...limitValues) + binWidthMm
	);
	return {
		type: 'bar',
		data: {
			datasets: [
				{
					type: 'bar',
					label: 'Readings per bin',
					data: charts.histogram.map((b) => ({ x: (b.fromMm + b.toMm) / 2, y: b.count })),
					backgroundColor: 'rgba(0,114,178,0.45)',
					borderColor: OKABE_ITO.blue,
					borderWidth: 1,
					barPercentage: 1,
					categoryPercentage: 1,
					grouped: false
				},
				...(curve.length > 0
					? [
							{
								type: 'line' as const,
								label: `Fitted ${assessment.chosenModel} curve`,
								data: curve,
								borderColor: OKABE_ITO.black,
								borderWidth: 2,
								pointRadius: 0
							}
						]
					: [])
			]
		},
		options: {
			animation: false,
			scales: {
				x: {
					type: 'linear',
					min: xMin,
					max: xMax,
					title: axisTitle('Cover (mm)', look),
					// Whole-number ticks, never rotated: a cover axis reads left to right.
					ticks: { ...axisTicks(look), maxRotation: 0, autoSkipPadding: 12 }
				},
				y: {
					beginAtZero: true,
					title: axisTitle('Number of readings', look),
					ticks: axisTicks(look)
				}
			},
			plugins: {
				legend: legendLabels(look),
				annotation: {
					annotations: {
						band: toleranceBand(assessment.requirement),
						...lineAnnotations(lines, look.fontSize)
					}
				}
			}
		}
	} as ChartConfiguration<'bar' | 'line'>;
}

/** The words a screen reader (or the report's caption) gives for the histogram. */
export function histogramDescription(assessment: PopulationAssessment): string {
	const lines = limitLines(assessment.requirement, assessment.characteristic.chosenMm);
	const d = assessment.description;
	const model = chosenModelFits(assessment)
		? ` The fitted ${assessment.chosenModel} curve is drawn over the bars.`
		: ' No fitted curve is drawn: the goodness-of-fit test rejected the model (or had too few readings).';
	return (
		`Histogram of ${d.n} readings from ${d.minMm} to ${d.maxMm} mm; ` +
		`${lines.map((l) => `${l.name} at ${mm(l.valueMm)}`).join(', ')}; ` +
		`the shaded band runs from c_min to the upper tolerance.${model}`
	);
}
