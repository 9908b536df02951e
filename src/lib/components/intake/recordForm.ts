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
