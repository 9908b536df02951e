/**
 * The look every chart shares, on the pages (chart.js in the browser) and in the report (chart.js
 * on the server): type size per medium, axis titles and ticks, legend text and the white box
 * behind a line's label. Browser-safe; colours are in palette.ts.
 */
import { AXIS_TEXT } from './palette';

export interface ChartLook {
	/** Base font size in px: the pages use chart.js's 12; the report's 900 px image wants more. */
	fontSize: number;
}

export const PAGE_LOOK: ChartLook = { fontSize: 12 };
export const PRINT_LOOK: ChartLook = { fontSize: 17 };

/** A font at the look's size; absent, chart.js's default (the pages' 12 px). */
const fontOf = (look?: ChartLook) => (look ? { font: { size: look.fontSize } } : {});

/** An axis title in the axis text colour. */
export const axisTitle = (text: string, look?: ChartLook) => ({
	display: true,
	text,
	color: AXIS_TEXT,
	...fontOf(look)
});

/** Tick labels in the axis text colour. */
export const axisTicks = (look?: ChartLook) => ({ color: AXIS_TEXT, ...fontOf(look) });

/** Legend entries in the axis text colour (extra chart.js label options may be added). */
export const legendLabels = (look?: ChartLook, extra: Record<string, unknown> = {}) => ({
	labels: { color: AXIS_TEXT, ...fontOf(look), ...extra }
});

/** The label of a limit line: on a white box so the bars behind do not hide it. */
export const lineLabel = (content: string, fontSize: number, position: 'start' | 'end') => ({
	display: true,
	content,
	position,
	backgroundColor: 'rgba(255,255,255,0.9)',
	color: AXIS_TEXT,
	font: { size: fontSize }
});
