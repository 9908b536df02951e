/**
 * chart.js registers nothing by itself when imported tree-shaken: every controller, element,
 * scale and plugin the charts use is registered here, once.
 */
import {
	BarController,
	BarElement,
	CategoryScale,
	Chart,
	Filler,
	Legend,
	LinearScale,
	LineController,
	LineElement,
	PointElement,
	ScatterController,
	Tooltip
} from 'chart.js';
import annotationPlugin from 'chartjs-plugin-annotation';
import { MatrixController, MatrixElement } from 'chartjs-chart-matrix';
import { BoxAndWiskers, BoxPlotController } from '@sgratzl/chartjs-chart-boxplot';

Chart.register(
	BarController,
	BarElement,
	CategoryScale,
	Filler,
	Legend,
	LinearScale,
	LineController,
	LineElement,
	PointElement,
	ScatterController,
	Tooltip,
	annotationPlugin,
	MatrixController,
	MatrixElement,
	BoxPlotController,
	BoxAndWiskers
);

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
export { Chart };
