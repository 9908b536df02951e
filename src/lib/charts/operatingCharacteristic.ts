/**
 * The operating characteristic of a plan: probability that the rules pass a population against
 * the true share of it below c_min, one line per rule (exact) and one for the whole rule set
 * (simulated, drawn with points so it reads as estimates), p0 and p1 marked.
 */
import { percent } from '$lib/format';
import type { ChartConfiguration, Plugin } from 'chart.js';
import type { OcCurve } from '$lib/analysis';
import { axisTicks, axisTitle, legendLabels, PAGE_LOOK, type ChartLook } from './look';
import { seriesColour, seriesDash } from './palette';

const METHOD_WORDS: Record<OcCurve['method'], string> = {
	'exact-binomial': 'exact, binomial',
	'noncentral-t': 'exact, noncentral t, normal model',
	simulation: 'seeded simulation'
};

/** The legend's words for a curve: its label and how it was obtained. */
export const curveLegend = (c: OcCurve) => `${c.label} (${METHOD_WORDS[c.method]})`;

/** Vertical lines at p0 and p1, labelled inside the plot. */
function shareLines(marks: { p: number; label: string }[], fontSize: number): Plugin<'line'> {
	return {
		id: 'planShares',
		afterDraw(chart) {
			const { ctx, chartArea } = chart;
			ctx.save();
			ctx.font = `${fontSize}px ${chart.options.font?.family ?? 'sans-serif'}`;
			marks.forEach(({ p, label }, i) => {
				const x = chart.scales.x.getPixelForValue(p * 100);
				ctx.setLineDash([4, 4]);
				ctx.strokeStyle = '#555555';
				ctx.beginPath();
				ctx.moveTo(x, chartArea.top);
				ctx.lineTo(x, chartArea.bottom);
				ctx.stroke();
				ctx.fillStyle = '#111111';
				const width = ctx.measureText(label).width;
				const lx = x + 4 + width > chartArea.right ? x - 4 - width : x + 4;
				// Staggered so the two labels never print over each other when p0 and p1 are close.
				ctx.fillText(label, lx, chartArea.bottom - 8 - i * (fontSize + 4));
			});
			ctx.restore();
		}
	};
}

export function operatingCharacteristicConfig(
	curves: readonly OcCurve[],
	p0: number,
	p1: number,
	look: ChartLook = PAGE_LOOK
): ChartConfiguration<'line'> {
	return {
		type: 'line',
		data: {
			datasets: curves.map((c, i) => ({
				label: curveLegend(c),
				data: c.points.map((pt) => ({ x: pt.p * 100, y: pt.accept * 100 })),
				borderColor: seriesColour(i),
				backgroundColor: seriesColour(i),
				borderDash: seriesDash(i),
				borderWidth: 2,
				pointRadius: c.method === 'simulation' ? 3 : 0
			}))
		},
		options: {
			animation: false,
			scales: {
				x: {
					type: 'linear',
					min: 0,
					title: axisTitle('True share of the population below c_min (%)', look),
					ticks: axisTicks(look)
				},
				y: {
					min: 0,
					max: 100,
					title: axisTitle('Probability the rules pass (%)', look),
					ticks: axisTicks(look)
				}
			},
			// A short line per series in the legend: a filled box would hide the dash pattern.
			plugins: {
				legend: {
					position: 'bottom',
					...legendLabels(look, { usePointStyle: true, pointStyle: 'line' })
				}
			}
		},
		plugins: [
			shareLines(
				[
					{ p: p0, label: `p0 ${percent(p0)}` },
					{ p: p1, label: `p1 ${percent(p1)}` }
				],
				look.fontSize
			)
		]
	};
}
