/** One text or number input of a form, described rather than written out (see Fields.svelte). */
export interface FieldSpec {
	name: string;
	label: string;
	hint?: string;
	required?: boolean;
	/** A number: the phone and tablet keyboards show digits and the decimal mark. */
	numeric?: boolean;
	type?: 'text' | 'date';
}
