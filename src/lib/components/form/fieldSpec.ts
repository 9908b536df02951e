import type { Option } from '$lib/intake/options';

/** One field of a form, described rather than written out (see Fields.svelte). */
export interface FieldSpec {
	name: string;
	label: string;
	hint?: string;
	required?: boolean;
	/** A number: the phone and tablet keyboards show digits and the decimal mark. */
	numeric?: boolean;
	type?: 'text' | 'date';
	/** A choice from a list rather than typed text. */
	options?: readonly Option[];
	/** Several lines of text (notes), across the whole form. */
	multiline?: boolean;
}
