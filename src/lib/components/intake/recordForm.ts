/** What each intake record's form takes, to create a record or to edit one. */
export interface RecordFormProps {
	/** The form action posted to: "?/create", "?/save"… */
	action: string;
	submitLabel: string;
	/** The fields as text: a failed post's echo, a saved record's values, or {} for a new one. */
	values: Record<string, string>;
	errors: Record<string, string>;
	message?: string | null;
	cancelHref?: string;
	/** Set while the record may not be changed (a frozen survey): shown, not editable. */
	disabled?: boolean;
}

interface FailedSave {
	values: Record<string, string>;
	errors: Record<string, string>;
	message?: string;
}

/** A create form: empty, or what a failed save echoed with its errors. */
export function createFormProps(
	form: FailedSave | null | undefined
): Pick<RecordFormProps, 'values' | 'errors' | 'message'> {
	return { values: form?.values ?? {}, errors: form?.errors ?? {}, message: form?.message };
}

/**
 * An edit page's form: the saved values, or what a failed save echoed with its errors; shown
 * read-only with the reason while the survey is frozen.
 */
export function editFormProps(
	data: { values: Record<string, string>; frozen?: string | null },
	form: FailedSave | null | undefined,
	cancelHref: string
): Omit<RecordFormProps, 'submitLabel'> {
	return {
		action: '?/save',
		values: form?.values ?? data.values,
		errors: form?.errors ?? {},
		message: form?.message ?? data.frozen ?? null,
		disabled: !!data.frozen,
		cancelHref
	};
}
