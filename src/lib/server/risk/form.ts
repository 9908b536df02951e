/**
 * The durability parameters as a form on a draft assessment: one group of fields per exposure
 * class of the snapshot, prefilled with what was entered (or the stated default) and its source.
 */
import {
	CARBONATION_DEFAULTS,
	CHLORIDE_DEFAULTS,
	durabilityParametersSchema,
	withDefaults,
	type DurabilityParameters
} from './parameters';

export interface DurabilityField {
	name: string;
	label: string;
	unit: string;
	value: number;
	source: string;
}

export interface DurabilityFieldGroup {
	exposureClass: string;
	model: 'carbonation' | 'chloride';
	fields: DurabilityField[];
}

const CARBONATION_FIELDS = [
	['kMmPerSqrtYear', 'Carbonation coefficient k', 'mm/√year', 'k'],
	['depthCov', 'Scatter of the carbonation depth (CoV)', '—', 'depthCov']
] as const;

const CHLORIDE_FIELDS = [
	['surfaceContent', 'Surface chloride content C_s', '% of binder', 'surfaceContent'],
	['initialContent', 'Initial chloride content C_0', '% of binder', 'initialContent'],
	['criticalContent', 'Critical chloride content', '% of binder', 'criticalContent'],
	['dM2PerS', 'Apparent diffusion coefficient D', 'm²/s', 'dM2PerS'],
	['dCov', 'Scatter of D (CoV)', '—', 'dCov']
] as const;

/** The form's groups for the exposure classes given, with the values now in force. */
export function durabilityFieldGroups(
	exposureClasses: readonly string[],
	entered: DurabilityParameters | null
): DurabilityFieldGroup[] {
	const current = withDefaults(exposureClasses, entered ?? {});
	return Object.entries(current).map(([exposureClass, p]) => {
		if (p.kind === 'carbonation') {
			const sources = CARBONATION_DEFAULTS[exposureClass];
			return {
				exposureClass,
				model: 'carbonation',
				fields: CARBONATION_FIELDS.map(([key, label, unit, sourceKey]) => ({
					name: `${exposureClass}.${key}`,
					label,
					unit,
					value: p[key],
					source: sources?.[sourceKey].source ?? ''
				}))
			};
		}
		const sources = CHLORIDE_DEFAULTS[exposureClass];
		return {
			exposureClass,
			model: 'chloride',
			fields: CHLORIDE_FIELDS.map(([key, label, unit, sourceKey]) => ({
				name: `${exposureClass}.${key}`,
				label,
				unit,
				value: p[key],
				source: sources?.[sourceKey].source ?? ''
			}))
		};
	});
}

export type DurabilityFormResult =
	| { ok: true; parameters: DurabilityParameters }
	| { ok: false; errors: Record<string, string>; values: Record<string, string> };

/** Reads the posted fields back into parameters, checked by the same schema as the API. */
export function readDurabilityForm(
	form: FormData,
	groups: readonly DurabilityFieldGroup[]
): DurabilityFormResult {
	const values: Record<string, string> = {};
	const record: Record<string, Record<string, unknown>> = {};
	for (const group of groups) {
		const entry: Record<string, unknown> = { kind: group.model };
		for (const field of group.fields) {
			const raw = String(form.get(field.name) ?? '').trim();
			values[field.name] = raw;
			entry[field.name.slice(group.exposureClass.length + 1)] = raw === '' ? NaN : Number(raw);
		}
		record[group.exposureClass] = entry;
	}
	const parsed = durabilityParametersSchema.safeParse(record);
	if (parsed.success) return { ok: true, parameters: parsed.data };
	const errors: Record<string, string> = {};
	for (const issue of parsed.error.issues) {
		const name = issue.path.join('.');
		errors[name] ??= issue.code === 'invalid_type' ? 'Enter a number.' : issue.message;
	}
	return { ok: false, errors, values };
}
