/**
 * The one-line confirmation shown after an edit page saves and returns to where the record is
 * shown. The edit action adds `?saved=<what>` to its redirect; the layout reads it. Only these
 * keys are shown, so a crafted link cannot put words of its own on the page.
 */
export const SAVED_NOTICES = {
	asset: "The asset's details were saved.",
	survey: "The survey's details were saved.",
	member: "The member's specified values were saved.",
	hole: 'The verification hole was saved.',
	'hole-deleted': 'The verification hole was deleted.'
} as const;

export type SavedWhat = keyof typeof SAVED_NOTICES;

/** `path` with `saved=<what>` added, for an edit action's redirect. */
export function withSavedNotice(path: string, what: SavedWhat): string {
	return `${path}${path.includes('?') ? '&' : '?'}saved=${what}`;
}

/** The notice for a page's `saved` parameter, or null when there is none or it is unknown. */
export function savedNoticeFor(saved: string | null): string | null {
	return saved !== null && Object.hasOwn(SAVED_NOTICES, saved)
		? SAVED_NOTICES[saved as SavedWhat]
		: null;
}
