/**
 * A chloride profile: the measured contents at each increment's mid-depth, the increment left
 * out of the fit marked apart, and the fitted error-function curve
 * C(x) = C_0 + (C_s − C_0)·erfc(x/(2√(D_a·t))) drawn over the sampled depths. One configuration
 * for the pages and the report.
 */
import type { ChartConfiguration } from 'chart.js';
import { erfc } from '$lib/analysis';
import { axisTicks, axisTitle, legendLabels, PAGE_LOOK, type ChartLook } from './look';
import { OKABE_ITO } from './palette';

export interface ProfileChartData {
	label: string;
	points: { depthMm: number; content: number; used: boolean }[];
	/** The fit, when the profile was fitted: C_s, C_0 (% of binder), D_a (mm²/year), age (years). */
	fit: {
		surfaceContent: number;
		initialContent: number;
		dMm2PerYear: number;
		ageYears: number;
	} | null;
	criticalContent: number | null;
}

function fittedCurve(fit: NonNullable<ProfileChartData['fit']>, deepestMm: number) {
	const scale = 2 * Math.sqrt(fit.dMm2PerYear * fit.ageYears);
	return Array.from({ length: 41 }, (_, i) => {
		const x = (deepestMm * i) / 40;
		return {
			x,
			y: fit.initialContent + (fit.surfaceContent - fit.initialContent) * erfc(x / scale)
		};
	});
}

export function chlorideProfileConfig(
	profile: ProfileChartData,
	look: ChartLook = PAGE_LOOK
): ChartConfiguration<'line'> {
	const deepest = Math.max(...profile.points.map((p) => p.depthMm)) + 5;
	const marker = look.fontSize > 14 ? 7 : 4;
	const datasets: ChartConfiguration<'line'>['data']['datasets'] = [
		{
			label: 'measured',
			data: profile.points.filter((p) => p.used).map((p) => ({ x: p.depthMm, y: p.content })),
			showLine: false,
			pointRadius: marker,
			pointStyle: 'circle',
			borderColor: OKABE_ITO.blue,
			backgroundColor: OKABE_ITO.blue
		},
		{
			label: 'outermost, left out',
			data: profile.points.filter((p) => !p.used).map((p) => ({ x: p.depthMm, y: p.content })),
			showLine: false,
			pointRadius: marker + 2,
			pointStyle: 'crossRot',
			borderWidth: 3,
			borderColor: OKABE_ITO.vermillion,
			backgroundColor: OKABE_ITO.vermillion
		}
	];
	if (profile.fit)
		datasets.push({
			label: 'fitted',
			data: fittedCurve(profile.fit, deepest),
			pointRadius: 0,
			borderWidth: look.fontSize > 14 ? 3 : 2,
			borderColor: OKABE_ITO.black,
			backgroundColor: OKABE_ITO.black
		});
	if (profile.criticalContent !== null)
		datasets.push({
			label: `C_crit ${profile.criticalContent} % (assumed)`,
			data: [
				{ x: 0, y: profile.criticalContent },
				{ x: deepest, y: profile.criticalContent }
			],
			pointRadius: 0,
			borderWidth: 2,
			borderDash: [6, 4],
			borderColor: OKABE_ITO.green,
			backgroundColor: OKABE_ITO.green
		});
	return {
		type: 'line',
		data: { datasets },
		options: {
			animation: false,
			scales: {
				x: {
					type: 'linear',
					min: 0,
					max: Math.ceil(deepest / 10) * 10,
					title: axisTitle('Depth below the surface (mm)', look),
					ticks: axisTicks(look)
				},
				y: {
					min: 0,
					title: axisTitle('Chloride (% of binder)', look),
					ticks: axisTicks(look)
				}
			},
			plugins: {
				legend: legendLabels(look, { usePointStyle: true }),
				title: axisTitle(profile.label, look)
			}
		}
	};
}
