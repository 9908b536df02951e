/**
 * Vertical limit lines on a cover axis: c_min, c_nom, c_nom + Δplus and the characteristic
 * cover. Each has its own dash pattern and a written label, so none is told apart by colour only.
 */
import { mm } from '$lib/format';
import type { CoverRequirement } from '$lib/analysis';
import { lineLabel } from './look';
import { OKABE_ITO } from './palette';

export interface LimitLine {
	id: string;
	name: string;
	valueMm: number;
	colour: string;
	dash: number[];
}

export function limitLines(requirement: CoverRequirement, characteristicMm: number | null) {
	const lines: LimitLine[] = [
		{
			id: 'cmin',
			name: 'c_min',
			valueMm: requirement.cMinMm,
			colour: OKABE_ITO.vermillion,
			dash: []
		},
		{ id: 'cnom', name: 'c_nom', valueMm: requirement.cNomMm, colour: OKABE_ITO.blue, dash: [8, 4] }
	];
	if (requirement.deltaPlusMm != null) {
		lines.push({
			id: 'cmax',
			name: 'c_nom + Δplus',
			valueMm: requirement.cNomMm + requirement.deltaPlusMm,
			colour: OKABE_ITO.purple,
			dash: [2, 3]
		});
	}
	if (characteristicMm !== null) {
		lines.push({
			id: 'ck',
			name: 'characteristic',
			valueMm: characteristicMm,
			colour: OKABE_ITO.black,
			dash: [10, 3, 2, 3]
		});
	}
	return lines;
}

/** chartjs-plugin-annotation entries for the lines, labels staggered so they do not overlap. */
export function lineAnnotations(lines: LimitLine[], fontSize = 12) {
	const labelSize = fontSize - 1;
	return Object.fromEntries(
		lines.map((line, i) => [
			line.id,
			{
				type: 'line' as const,
				xMin: line.valueMm,
				xMax: line.valueMm,
				borderColor: line.colour,
				borderWidth: 2,
				borderDash: line.dash,
				label: {
					...lineLabel(`${line.name} ${mm(line.valueMm)}`, labelSize, 'start'),
					yAdjust: -i * Math.round(labelSize * 2)
				}
			}
		])
	);
}

/** A shaded band between c_min and c_nom + Δplus (or c_nom): the tolerance band. */
export function toleranceBand(requirement: CoverRequirement) {
	const upper =
		requirement.deltaPlusMm != null
			? requirement.cNomMm + requirement.deltaPlusMm
			: requirement.cNomMm;
	return {
		type: 'box' as const,
		xMin: requirement.cMinMm,
		xMax: upper,
		backgroundColor: 'rgba(86,180,233,0.12)',
		borderWidth: 0,
		drawTime: 'beforeDatasetsDraw' as const
	};
}
