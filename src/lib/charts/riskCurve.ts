/**
 * Share depassivated against age, one line per part of the structure, the design life marked:
 * one configuration for the owner's pages and the report, so a part keeps its colour and dash.
 * Series come in the order the owner reads them (worst first), in both places.
 */
import type { ChartConfiguration, Plugin } from 'chart.js';
import type { ChartLook } from './histogram';
import { PAGE_LOOK } from './histogram';
import { AXIS_TEXT, seriesColour, seriesDash } from './palette';

export interface RiskSeries {
	label: string;
	curve: { years: number; share: number }[];
}

/** A labelled dashed vertical line at the design life. */
function designLifeLine(years: number, fontSize: number): Plugin<'line'> {
	return {
		id: 'designLife',
		afterDraw(chart) {
			const x = chart.scales.x.getPixelForValue(years);
			const { ctx, chartArea } = chart;
			ctx.save();
			ctx.setLineDash([6, 4]);
			ctx.strokeStyle = '#111111';
			ctx.lineWidth = 2;
			ctx.beginPath();
			ctx.moveTo(x, chartArea.top);
			ctx.lineTo(x, chartArea.bottom);
			ctx.stroke();
			ctx.fillStyle = '#111111';
			ctx.font = `${fontSize}px ${chart.options.font?.family ?? 'sans-serif'}`;
			const label = `design life ${years} years`;
			// Near the right edge the label goes to the left of the line, so it is never cut.
			const width = ctx.measureText(label).width;
			const lx = x + 6 + width > chartArea.right ? x - 6 - width : x + 6;
			ctx.fillText(label, lx, chartArea.top + fontSize + 2);
			ctx.restore();
		}
	};
}

export function riskCurveConfig(
	series: readonly RiskSeries[],
	designLifeYears: number,
	look: ChartLook = PAGE_LOOK
): ChartConfiguration<'line'> {
	const font = { size: look.fontSize };
	return {
		type: 'line',
		data: {
			datasets: series.map((s, i) => ({
				label: s.label,
				data: s.curve.map((c) => ({ x: c.years, y: c.share * 100 })),
				borderColor: seriesColour(i),
				backgroundColor: seriesColour(i),
				borderDash: seriesDash(i),
				borderWidth: look.fontSize > 14 ? 3 : 2,
				pointRadius: look.fontSize > 14 ? 0 : 2
			}))
		},
		options: {
			animation: false,
			scales: {
				x: {
					type: 'linear',
					min: 0,
					title: { display: true, text: 'Age of the structure (years)', color: AXIS_TEXT, font },
					ticks: { color: AXIS_TEXT, font }
				},
				y: {
					min: 0,
					max: 100,
					title: { display: true, text: 'Share depassivated (%)', color: AXIS_TEXT, font },
					ticks: { color: AXIS_TEXT, font }
				}
			},
			plugins: { legend: { labels: { color: AXIS_TEXT, font } } }
		},
		plugins: [designLifeLine(designLifeYears, look.fontSize)]
	};
}
