/** What a field's control is described by: its error if any, else its hint. */
export function describedBy(id: string, error?: string, hint?: string): string | undefined {
	return error ? `${id}-error` : hint ? `${id}-hint` : undefined;
}

/** The look of an input or text area, red-edged while it holds an error. */
export function controlClass(error?: string): string {
	const edge = error ? 'border-verdict-fail' : 'border-concrete-300';
	return `block w-full rounded-md border bg-white px-3 py-2 text-concrete-900 shadow-sm focus:border-brand-600 ${edge}`;
}
