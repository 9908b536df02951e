/**
 * Share depassivated against age, one line per part of the structure, the design life marked:
 * one configuration for the owner's pages and the report, so a part keeps its colour and dash.
 * Series come in the order the owner reads them (worst first), in both places. A part projected
 * from measured fronts has its bootstrap band drawn as a shaded area about its line (two
 * unlabelled datasets, the upper filled down to the lower; chart.js's Filler must be registered).
 */
import type { ChartConfiguration, ChartDataset, LegendItem, Plugin } from 'chart.js';
import { axisTicks, axisTitle, legendLabels, PAGE_LOOK, type ChartLook } from './look';
import { seriesColour, seriesDash } from './palette';

export interface RiskSeries {
	label: string;
	/** low/high: the band (5 % and 95 %) where the projection comes from measured fronts. */
	curve: { years: number; share: number; low?: number; high?: number }[];
}

/** Marks the band's datasets, so the legend leaves them out. */
export const BAND_SUFFIX = ' · band';

/** Hex colour with an alpha (the palette gives #rrggbb). */
const translucent = (hex: string, alpha: number) =>
	`${hex}${Math.round(alpha * 255)
		.toString(16)
		.padStart(2, '0')}`;

function bandDatasets(s: RiskSeries, i: number): ChartDataset<'line'>[] {
	if (!s.curve.some((c) => c.low !== undefined && c.high !== undefined)) return [];
	const edge = (pick: (c: RiskSeries['curve'][number]) => number | undefined) =>
		s.curve.map((c) => ({ x: c.years, y: (pick(c) ?? c.share) * 100 }));
	const common = {
		borderWidth: 0,
		pointRadius: 0,
		borderColor: translucent(seriesColour(i), 0),
		backgroundColor: translucent(seriesColour(i), 0.18)
	};
	return [
		{ ...common, label: `${s.label} 5 %${BAND_SUFFIX}`, data: edge((c) => c.low), fill: false },
		{ ...common, label: `${s.label} 95 %${BAND_SUFFIX}`, data: edge((c) => c.high), fill: '-1' }
	];
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
	return {
		type: 'line',
		data: {
			datasets: series.flatMap((s, i) => [
				{
					label: s.label,
					data: s.curve.map((c) => ({ x: c.years, y: c.share * 100 })),
					borderColor: seriesColour(i),
					backgroundColor: seriesColour(i),
					borderDash: seriesDash(i),
					borderWidth: look.fontSize > 14 ? 3 : 2,
					pointRadius: look.fontSize > 14 ? 0 : 2,
					fill: false
				},
				...bandDatasets(s, i)
			])
		},
		options: {
			animation: false,
			scales: {
				x: {
					type: 'linear',
					min: 0,
					title: axisTitle('Age of the structure (years)', look),
					ticks: axisTicks(look)
				},
				y: {
					min: 0,
					max: 100,
					title: axisTitle('Share depassivated (%)', look),
					ticks: axisTicks(look)
				}
			},
			plugins: {
				legend: legendLabels(look, {
					filter: (item: LegendItem) => !item.text.endsWith(BAND_SUFFIX)
				})
			}
		},
		plugins: [designLifeLine(designLifeYears, look.fontSize)]
	};
}
