import Papa from 'papaparse';
import { z } from 'zod';
import { InputError } from '../domainErrors';
import { memberSchema, type MemberInput } from '$lib/intake/schemas';
import { suggestEnCover } from './requirements';

export const pastedTableSchema = z.object({
	table: z
		.string()
		.min(1, 'Paste a table.')
		.max(1_000_000)
		.describe(
			'Tab- or comma-separated, header row first: label, type, face, exposure, c_min, c_nom, delta c_dev, bar diameter, spacing, depth, width, height, notes (label needed). With EN 1992-1-1, c_min and c_nom are suggested when left out.'
		)
});

/** Header names a pasted member table may use, for each member field. */
const COLUMN_ALIASES: [keyof MemberInput, RegExp][] = [
	['label', /^(label|member|name)$/i],
	['memberType', /^(type|member type)$/i],
	['face', /^face$/i],
	['exposureClass', /^(exposure|exposure class)$/i],
	['structuralClass', /^(structural class|class)$/i],
	['cMinMm', /^c_?min/i],
	['cNomMm', /^c_?nom/i],
	['deltaCDevMm', /^(Δ|delta)\s*c_?dev/i],
	['barDiameterMm', /^(bar )?dia(meter)?/i],
	['barSpacingMm', /^(bar )?spacing/i],
	['memberDepthMm', /^depth|^member depth/i],
	['gridWidthMm', /^(grid )?width/i],
	['gridHeightMm', /^(grid )?height/i],
	['notes', /^notes?$/i]
];

function headerFields(headers: string[]) {
	return headers.map(
		(h) => COLUMN_ALIASES.find(([, re]) => re.test(h.replace(/\(mm\)/i, '').trim()))?.[0]
	);
}

/**
 * A pasted Δc_dev is the project's: c_nom = c_min + that (EN 1992-1-1 (4.1)), not + 10 mm. One
 * that is not a number is left to the member schema, which names it.
 */
function pastedDeltaCDevMm(value: unknown): number | undefined {
	const mm = Number(String(value).replace(',', '.'));
	return Number.isFinite(mm) ? mm : undefined;
}

/**
 * Members from a table pasted from a spreadsheet (tab-separated, or commas), header row first.
 * The requirement defaults to the asset's code; with EN 1992-1-1, c_min, c_nom and Δc_dev are
 * suggested from the exposure class, bar diameter and Δc_dev (10 mm unless the table gives one)
 * when the table leaves them out.
 */
export function parsePastedMembers(
	text: string,
	defaultSource: MemberInput['requirementSource']
): MemberInput[] {
	const parsed = Papa.parse<string[]>(text.trim(), {
		delimiter: text.includes('\t') ? '\t' : ',',
		skipEmptyLines: 'greedy'
	});
	const [headers, ...rows] = parsed.data;
	if (!headers || rows.length === 0) {
		throw new InputError('Paste a header row and at least one member row.', {
			table: ['Nothing to create.']
		});
	}
	const fields = headerFields(headers);
	if (!fields.includes('label')) {
		throw new InputError('The pasted table needs a "label" column.', {
			table: ['No label column.']
		});
	}
	const problems: string[] = [];
	const members: MemberInput[] = [];
	rows.forEach((row, i) => {
		const values: Record<string, unknown> = {
			requirementSource: defaultSource,
			structuralClass: 'S4',
			deltaCDevMm: 10
		};
		fields.forEach((field, c) => {
			if (field && row[c]?.trim()) values[field] = row[c].trim();
		});
		if (defaultSource === 'EN 1992-1-1' && values.cMinMm == null) {
			const s = suggestEnCover(
				String(values.exposureClass ?? ''),
				Number(values.barDiameterMm ?? 0) || 0,
				String(values.structuralClass),
				pastedDeltaCDevMm(values.deltaCDevMm)
			);
			if (s)
				Object.assign(values, {
					cMinMm: s.cMinMm,
					cNomMm: values.cNomMm ?? s.cNomMm,
					deltaCDevMm: s.deltaCDevMm
				});
		}
		const result = memberSchema.safeParse(values);
		if (result.success) members.push(result.data);
		else {
			const issue = result.error.issues[0];
			problems.push(`Row ${i + 2}: ${String(issue.path[0])}: ${issue.message}`);
		}
	});
	if (problems.length) {
		throw new InputError(
			`The pasted table has problems; no member was created. ${problems.slice(0, 10).join(' ')}`,
			{ table: problems }
		);
	}
	return members;
}
