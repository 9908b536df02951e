/**
 * Colours and dash patterns shared by the pages' charts (chart.js in the browser) and the
 * report's charts (chart.js on the server), so a population has the same look in both.
 */

/** Okabe–Ito colours (Okabe & Ito 2008), colour-blind safe; lines also differ by dash. */
export const OKABE_ITO = {
	black: '#000000',
	orange: '#e69f00',
	sky: '#56b4e9',
	green: '#009e73',
	yellow: '#f0e442',
	blue: '#0072b2',
	vermillion: '#d55e00',
	purple: '#cc79a7'
};

export const AXIS_TEXT = '#24292b';

/** Series colours in order of use, and a dash per series so colour is never the only cue. */
export const SERIES_COLOURS = [
	OKABE_ITO.blue,
	OKABE_ITO.vermillion,
	OKABE_ITO.green,
	OKABE_ITO.purple,
	OKABE_ITO.orange,
	OKABE_ITO.sky
];
export const SERIES_DASHES: number[][] = [[], [10, 5], [3, 3], [12, 4, 3, 4], [6, 2], [2, 6]];

export const seriesColour = (i: number) => SERIES_COLOURS[i % SERIES_COLOURS.length];
export const seriesDash = (i: number) => SERIES_DASHES[i % SERIES_DASHES.length];
