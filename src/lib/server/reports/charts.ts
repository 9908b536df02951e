/**
 * Charts for the PDF, drawn on the server with chart.js on @napi-rs/canvas (STACK.md). Only the
 * controllers, elements and scales used here are registered. Lines are told apart by dash
 * pattern as well as colour; limits are drawn as labelled vertical lines.
 */
import { createCanvas } from '@napi-rs/canvas';
import {
	BarController,
	BarElement,
	CategoryScale,
	Chart,
	Legend,
	LinearScale,
	LineController,
	LineElement,
	PointElement,
	type ChartConfiguration,
	type Plugin
} from 'chart.js';
import type { HistogramBin } from '$lib/analysis';
import type { PopulationRisk } from '$lib/server/risk';

Chart.register(
	BarController,
	BarElement,
	CategoryScale,
	LinearScale,
	LineController,
	LineElement,
	PointElement,
	Legend
);

const WIDTH = 900;
const HEIGHT = 420;
/** Okabe–Ito colour-blind-safe palette. */
const PALETTE = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9'];
const DASHES = [[], [10, 5], [3, 3], [12, 4, 3, 4], [6, 2], [2, 6]];

/** Draws a labelled vertical line at an x position given by `pixelOf`. */
function markerPlugin(label: string, pixelOf: (chart: Chart) => number | null): Plugin {
	return {
		id: 'marker',
		afterDraw(chart) {
			const x = pixelOf(chart);
			if (x === null) return;
			const { ctx, chartArea } = chart;
			ctx.save();
			ctx.strokeStyle = '#111111';
			ctx.setLineDash([6, 4]);
			ctx.lineWidth = 2;
			ctx.beginPath();
			ctx.moveTo(x, chartArea.top);
			ctx.lineTo(x, chartArea.bottom);
			ctx.stroke();
			ctx.fillStyle = '#111111';
			ctx.font = '16px sans-serif';
			ctx.fillText(label, x + 6, chartArea.top + 18);
			ctx.restore();
		}
	};
}

function render(config: ChartConfiguration): Buffer {
	const canvas = createCanvas(WIDTH, HEIGHT);
	const context = canvas.getContext('2d');
	context.fillStyle = '#ffffff';
	context.fillRect(0, 0, WIDTH, HEIGHT);
	const chart = new Chart(canvas as unknown as HTMLCanvasElement, config);
	const png = canvas.toBuffer('image/png');
	chart.destroy();
	return png;
}

const axis = (title: string) => ({
	title: { display: true, text: title, font: { size: 16 } },
	ticks: { font: { size: 14 } }
});

/** Histogram of readings (count per bin) with the c_min line. */
export function histogramPng(bins: readonly HistogramBin[], cMinMm: number): Buffer {
	const labels = bins.map((b) => `${b.fromMm.toFixed(0)}–${b.toMm.toFixed(0)}`);
	const pixelOfCMin = (chart: Chart) => {
		const i = bins.findIndex((b) => cMinMm >= b.fromMm && cMinMm < b.toMm);
		if (i < 0) return null;
		const scale = chart.scales.x;
		const step =
			bins.length > 1 ? scale.getPixelForValue(1) - scale.getPixelForValue(0) : scale.width;
		const fraction = (cMinMm - bins[i].fromMm) / (bins[i].toMm - bins[i].fromMm);
		return scale.getPixelForValue(i) - step / 2 + fraction * step;
	};
	return render({
		type: 'bar',
		data: {
			labels,
			datasets: [
				{
					label: 'Readings',
					data: bins.map((b) => b.count),
					backgroundColor: '#56B4E9',
					borderColor: '#0072B2',
					borderWidth: 1,
					barPercentage: 1,
					categoryPercentage: 1
				}
			]
		},
		options: {
			responsive: false,
			animation: false,
			devicePixelRatio: 1,
			plugins: { legend: { display: false } },
			scales: { x: axis('Cover (mm)'), y: { ...axis('Number of readings'), beginAtZero: true } }
		},
		plugins: [markerPlugin(`c_min ${cMinMm} mm`, pixelOfCMin)]
	});
}

/** Share depassivated (model, %) against age (years) per population, design life marked. */
export function riskCurvePng(
	populations: readonly PopulationRisk[],
	designLifeYears: number
): Buffer {
	const shown = populations.filter((p) => p.curve.length > 0);
	return render({
		type: 'line',
		data: {
			datasets: shown.map((p, i) => ({
				label: p.label,
				data: p.curve.map((c) => ({ x: c.years, y: c.modelProbability * 100 })),
				borderColor: PALETTE[i % PALETTE.length],
				borderDash: DASHES[i % DASHES.length],
				borderWidth: 3,
				pointRadius: 0
			}))
		},
		options: {
			responsive: false,
			animation: false,
			devicePixelRatio: 1,
			plugins: { legend: { display: true, labels: { font: { size: 14 } } } },
			scales: {
				x: { ...axis('Age of the structure (years)'), type: 'linear', min: 0 },
				y: { ...axis('Share depassivated (%)'), min: 0, max: 100 }
			}
		},
		plugins: [
			markerPlugin(`design life ${designLifeYears} years`, (chart) =>
				chart.scales.x.getPixelForValue(designLifeYears)
			)
		]
	});
}
