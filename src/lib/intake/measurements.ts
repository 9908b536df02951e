import { z } from 'zod';
import { CHLORIDE_BASES } from '$lib/words';
import { optionalNumber, optionalText, text } from './schemas';

/**
 * Input schemas of the durability measurements taken on a member during a survey: carbonation
 * tests (depth of the carbonated front) and chloride profiles (content at depth increments).
 * Shared by the forms, the API and the browser; the values are kept as they were read.
 */

const MAX_DEPTH_MM = 300;
const location = {
	label: text(80).min(1, 'Give the test location a label.'),
	xMm: optionalNumber('x', -1e7, 1e7),
	yMm: optionalNumber('y', -1e7, 1e7),
	testedOn: z.iso.date({ error: 'Give the test date as YYYY-MM-DD.' }),
	method: optionalText(160),
	notes: optionalText(2000)
};

/** Numbers typed in one field, separated by spaces or semicolons (a comma is a decimal mark). */
function numberList(value: unknown): unknown {
	if (typeof value !== 'string') return value ?? [];
	return value
		.split(/[\s;]+/)
		.filter(Boolean)
		.map((v) => Number(v.replace(',', '.')));
}

const depthReadings = z.preprocess(
	numberList,
	z
		.array(
			z
				.number({ error: 'Each depth reading must be a number in mm.' })
				.min(0, 'A depth reading cannot be negative.')
				.max(MAX_DEPTH_MM, `A depth reading is at most ${MAX_DEPTH_MM} mm.`)
		)
		.max(50, 'At most 50 depth readings a test.')
		.default([])
);

export const carbonationTestSchema = z
	.object({
		...location,
		depthsMm: depthReadings.describe(
			'The individual depths read along the sprayed face, in mm, in the order read.'
		),
		depthMinMm: optionalNumber('Minimum depth', 0, MAX_DEPTH_MM),
		depthMeanMm: optionalNumber('Mean depth', 0, MAX_DEPTH_MM),
		depthMaxMm: optionalNumber('Maximum depth', 0, MAX_DEPTH_MM)
	})
	.superRefine((t, ctx) => {
		if (t.depthsMm.length === 0 && t.depthMeanMm === null) {
			ctx.addIssue({
				code: 'custom',
				path: ['depthsMm'],
				message: 'Give the depth readings, or the mean depth as read.'
			});
		}
		const [min, mean, max] = [t.depthMinMm, t.depthMeanMm, t.depthMaxMm];
		const order: [number | null, number | null, string][] = [
			[min, mean, 'The minimum depth is more than the mean.'],
			[mean, max, 'The mean depth is more than the maximum.'],
			[min, max, 'The minimum depth is more than the maximum.']
		];
		for (const [low, high, message] of order) {
			if (low !== null && high !== null && low > high) {
				ctx.addIssue({ code: 'custom', path: ['depthMeanMm'], message });
				return;
			}
		}
		const outside = t.depthsMm.find((d) => (min !== null && d < min) || (max !== null && d > max));
		if (outside !== undefined) {
			ctx.addIssue({
				code: 'custom',
				path: ['depthsMm'],
				message: `The reading ${outside} mm lies outside the minimum and maximum given.`
			});
		}
	});
export type CarbonationTestInput = z.infer<typeof carbonationTestSchema>;

export const chlorideIncrementSchema = z.object({
	fromMm: z.number().describe('Depth where the increment starts, mm from the surface.'),
	toMm: z.number().describe('Depth where it ends, mm.'),
	chloridePercent: z.number().describe('Chloride content, % by mass of the profile’s basis.')
});
export type ChlorideIncrementInput = z.infer<typeof chlorideIncrementSchema>;

/**
 * Increments typed one a line, "from to content" (tabs from a spreadsheet work too). A line
 * that is not three numbers becomes the message itself, naming the line (see the array's error).
 */
function incrementLines(value: unknown): unknown {
	if (typeof value !== 'string') return value;
	const lines = value.split(/\r?\n/).map((l) => l.trim());
	const rows: ChlorideIncrementInput[] = [];
	for (const [i, line] of lines.entries()) {
		if (!line) continue;
		const cells = line.split(/[\s;]+/).map((v) => Number(v.replace(',', '.')));
		if (cells.length !== 3 || cells.some((n) => !Number.isFinite(n))) {
			return `Line ${i + 1}: give the from-depth, the to-depth (mm) and the chloride content (%), three numbers.`;
		}
		rows.push({ fromMm: cells[0], toMm: cells[1], chloridePercent: cells[2] });
	}
	return rows;
}

/** Range and order of the increments, each problem naming its increment (1 = outermost). */
function checkIncrements(rows: ChlorideIncrementInput[], ctx: z.RefinementCtx) {
	const problem = (message: string) =>
		ctx.addIssue({ code: 'custom', path: ['increments'], message });
	let previousTo = -Infinity;
	for (const [i, r] of rows.entries()) {
		const n = `Increment ${i + 1} (${r.fromMm}–${r.toMm} mm)`;
		if (r.fromMm < 0 || r.toMm > MAX_DEPTH_MM)
			return problem(`${n}: depths run from 0 to ${MAX_DEPTH_MM} mm.`);
		if (r.toMm <= r.fromMm)
			return problem(`${n}: the to-depth must be deeper than the from-depth.`);
		if (r.fromMm < previousTo)
			return problem(`${n}: overlaps the increment before; list them from the surface inwards.`);
		if (r.chloridePercent < 0 || r.chloridePercent > 20)
			return problem(`${n}: the chloride content is a percentage between 0 and 20.`);
		previousTo = r.toMm;
	}
}

export const chlorideProfileSchema = z
	.object({
		...location,
		basis: z.enum(CHLORIDE_BASES, {
			error: 'Say whether the contents are % by mass of binder or of concrete.'
		}),
		binderContentKgM3: optionalNumber('Binder content', 100, 1000).describe(
			'Binder content assumed for the conversion to % of binder, kg/m³ (needed for basis concrete).'
		),
		concreteDensityKgM3: optionalNumber('Concrete density', 1500, 3000).describe(
			'Density of the concrete assumed for the conversion, kg/m³ (needed for basis concrete).'
		),
		initialContentPercent: optionalNumber('Background chloride content', 0, 5).describe(
			'Chloride content of the concrete as cast (Ci), measured deep in the member or stated, in the same basis; null when neither.'
		),
		increments: z.preprocess(
			incrementLines,
			z
				.array(chlorideIncrementSchema, {
					error: (issue) =>
						typeof issue.input === 'string' ? issue.input : 'Give the increments as a list.'
				})
				.min(1, 'Give at least one increment.')
				.max(30, 'At most 30 increments a profile.')
		)
	})
	.superRefine((p, ctx) => {
		checkIncrements(p.increments, ctx);
		if (
			p.basis === 'concrete' &&
			(p.binderContentKgM3 === null || p.concreteDensityKgM3 === null)
		) {
			ctx.addIssue({
				code: 'custom',
				path: [p.binderContentKgM3 === null ? 'binderContentKgM3' : 'concreteDensityKgM3'],
				message:
					'Contents by mass of concrete need the assumed binder content and concrete density, to convert them to % of binder.'
			});
		}
	});
export type ChlorideProfileInput = z.infer<typeof chlorideProfileSchema>;

/**
 * % by mass of concrete → % by mass of binder: chloride mass per m³ is the same either way,
 * so C_binder = C_concrete × ρ_concrete / binder content (common practice; both kg/m³).
 */
export function percentOfBinder(
	percent: number,
	profile: Pick<ChlorideProfileInput, 'basis' | 'binderContentKgM3' | 'concreteDensityKgM3'>
): number {
	if (profile.basis === 'binder') return percent;
	return (percent * profile.concreteDensityKgM3!) / profile.binderContentKgM3!;
}

/** The conversion in words, or null when the contents are already of binder. */
export function conversionNote(
	profile: Pick<ChlorideProfileInput, 'basis' | 'binderContentKgM3' | 'concreteDensityKgM3'>
): string | null {
	if (profile.basis === 'binder') return null;
	return `% by mass of concrete × ${profile.concreteDensityKgM3} kg/m³ (assumed concrete density) ÷ ${profile.binderContentKgM3} kg/m³ (assumed binder content) = % by mass of binder`;
}

function summarySource(
	t: Pick<CarbonationTestInput, 'depthMinMm' | 'depthMeanMm' | 'depthMaxMm'>,
	readings: number
): string {
	const given = [t.depthMinMm, t.depthMeanMm, t.depthMaxMm].filter((v) => v !== null).length;
	if (given === 3 || readings === 0) return 'as read';
	if (given === 0) return `from the ${readings} readings`;
	return `as read where given, else from the ${readings} readings`;
}

/** Min, mean and max of a carbonation test: as read where given, else from its readings. */
export function carbonationDepths(
	t: Pick<CarbonationTestInput, 'depthsMm' | 'depthMinMm' | 'depthMeanMm' | 'depthMaxMm'>
) {
	const n = t.depthsMm.length;
	const fromReadings = {
		min: n ? Math.min(...t.depthsMm) : null,
		mean: n ? t.depthsMm.reduce((s, d) => s + d, 0) / n : null,
		max: n ? Math.max(...t.depthsMm) : null
	};
	return {
		minMm: t.depthMinMm ?? fromReadings.min,
		meanMm: t.depthMeanMm ?? fromReadings.mean!,
		maxMm: t.depthMaxMm ?? fromReadings.max,
		/** Where min, mean and max come from, in words for the tables. */
		meanSource: summarySource(t, n)
	};
}

/**
 * Age of the concrete at a test, in years, from the year of construction: only the year is
 * recorded, so mid-year (1 July) is taken as the casting date; a Julian year of 365.25 days.
 */
export function concreteAgeYears(yearOfConstruction: number, testedOn: string): number {
	const tested = Date.parse(`${testedOn}T00:00:00Z`);
	return (tested - Date.UTC(yearOfConstruction, 6, 1)) / (365.25 * 86_400_000);
}
