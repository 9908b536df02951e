/**
 * Charts for the PDF, drawn on the server with chart.js on @napi-rs/canvas (STACK.md), from the
 * same configurations as the pages' charts (src/lib/charts), at a print size.
 */
import { createCanvas } from '@napi-rs/canvas';
import {
	BarController,
	BarElement,
	Chart,
	Filler,
	Legend,
	LinearScale,
	LineController,
	LineElement,
	PointElement,
	Title,
	type ChartConfiguration
} from 'chart.js';
import annotationPlugin from 'chartjs-plugin-annotation';
import type { PopulationAssessment } from '$lib/analysis';
import { histogramConfig } from '$lib/charts/histogram';
import { PRINT_LOOK } from '$lib/charts/look';
import { riskCurveConfig, type RiskSeries } from '$lib/charts/riskCurve';
import { chlorideProfileConfig, type ProfileChartData } from '$lib/charts/chlorideProfile';
import { CHART_FONT_FAMILY, registerChartFonts } from './fonts';

Chart.register(
	BarController,
	BarElement,
	LinearScale,
	LineController,
	LineElement,
	PointElement,
	Legend,
	Filler,
	Title,
	annotationPlugin
);
// Server-side chart.js is this process's own copy: its default font is the report's typeface.
Chart.defaults.font.family = CHART_FONT_FAMILY;

export const CHART_WIDTH = 900;
export const CHART_HEIGHT = 420;

function render<T extends ChartConfiguration<'bar' | 'line'> | ChartConfiguration<'line'>>(
	config: T,
	height = CHART_HEIGHT,
	width = CHART_WIDTH
): Buffer {
	registerChartFonts();
	const canvas = createCanvas(width, height);
	const context = canvas.getContext('2d');
	context.fillStyle = '#ffffff';
	context.fillRect(0, 0, width, height);
	const chart = new Chart(
		canvas as unknown as HTMLCanvasElement,
		{
			...config,
			options: {
				...config.options,
				responsive: false,
				animation: false,
				devicePixelRatio: 1
			}
		} as ChartConfiguration
	);
	const png = canvas.toBuffer('image/png');
	chart.destroy();
	return png;
}

/** Histogram of a population's readings against c_min, c_nom and the tolerance band. */
export function histogramPng(assessment: PopulationAssessment): Buffer {
	return render(histogramConfig(assessment, PRINT_LOOK));
}

/** Share depassivated (%) against age (years) per part, design life marked. */
export function riskCurvePng(series: readonly RiskSeries[], designLifeYears: number): Buffer {
	return render(riskCurveConfig(series, designLifeYears, PRINT_LOOK));
}

/**
 * A chloride profile's chart is smaller than the others (there is one per profile, and drawing
 * and encoding cost grows with the pixels): 640 × 260 px, printed across the text width.
 */
export const PROFILE_CHART = { width: 640, height: 260 };

/** One chloride profile: measured points, the excluded increment marked, the fitted curve. */
export function chlorideProfilePng(profile: ProfileChartData): Buffer {
	return render(
		chlorideProfileConfig(profile, { fontSize: 13 }),
		PROFILE_CHART.height,
		PROFILE_CHART.width
	);
}
