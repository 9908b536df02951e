import { DESIGN_CODES, MEMBER_FACES, MEMBER_TYPES } from '$lib/words';

export interface Option {
	value: string;
	label: string;
}

const asOptions = (list: readonly string[]): Option[] => list.map((v) => ({ value: v, label: v }));

/** Where a requirement comes from: a design code's table, or the project's own specification. */
export const DESIGN_CODE_OPTIONS: Option[] = DESIGN_CODES.map((c) => ({
	value: c,
	label: c === 'project' ? 'Project specification' : c
}));
export const MEMBER_TYPE_OPTIONS = asOptions(MEMBER_TYPES);
export const MEMBER_FACE_OPTIONS = asOptions(MEMBER_FACES);
export const UNIT_OPTIONS: Option[] = [
	{ value: 'mm', label: 'millimetres' },
	{ value: 'inch', label: 'inches' }
];
