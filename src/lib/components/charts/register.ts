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

export { AXIS_TEXT, OKABE_ITO } from '$lib/charts/palette';
export { Chart };
