/** The browser side of the import API: typed calls and the shapes they answer. */
import { CARBONATION_FIELDS, CHLORIDE_FIELDS } from '$lib/intake/measurementColumns';
export const FIELDS = [
	['memberLabel', 'Member label'],
	['x', 'x'],
	['y', 'y'],
	['cover', 'Cover'],
	['diameter', 'Bar diameter'],
	['spacing', 'Bar spacing'],
	['direction', 'Direction or layer'],
	['note', 'Note']
] as const;
export type Field = (typeof FIELDS)[number][0];

/** What a file holds; measurements go through the same two steps as readings. */
export type ImportKind = 'readings' | 'carbonation' | 'chloride';

/** The mapping form's fields for a kind of file: [field, label, help]. */
export function fieldsOf(kind: ImportKind): readonly (readonly [string, string, string?])[] {
	if (kind === 'carbonation') return CARBONATION_FIELDS;
	if (kind === 'chloride') return CHLORIDE_FIELDS;
	return FIELDS;
}

/** The fields that hold lengths, each read in its own unit (the server's LENGTH_FIELDS). */
export const LENGTH_FIELDS = ['x', 'y', 'cover', 'diameter', 'spacing'] as const;
export type LengthField = (typeof LENGTH_FIELDS)[number];
export const UNITS = [
	['mm', 'mm'],
	['m', 'm (×1000)'],
	['inch', 'inch (×25.4)']
] as const;
export type Unit = (typeof UNITS)[number][0];
export const isLengthField = (f: string): f is LengthField =>
	(LENGTH_FIELDS as readonly string[]).includes(f);

/** What the start request sends: the mapping and the choices made against the preview. */
export interface StartBody {
	mapping: Record<string, number | null>;
	options: Record<string, unknown> & {
		columnUnits: Partial<Record<LengthField, Unit>>;
		failingRows: string;
		coverMaxMm: number;
		acceptSmallCovers: boolean;
		fixedMemberLabel: string | null;
	};
	confirmDuplicate: boolean;
	saveTemplateAs: string | null;
	headerSignature: string;
}

export type { CheckedRow } from '$lib/intake/checkedRow';

export interface Upload {
	batchId: number;
	preview: {
		format: 'csv' | 'xlsx';
		settings: Record<string, string | number | boolean>;
		headers: string[];
		rows: string[][];
		suggestedMapping: Partial<Record<string, number>>;
		suggestedUnits: Partial<Record<LengthField, Unit>>;
		headerSignature: string;
		warnings: string[];
	};
	duplicateOf: { batchId: number; fileName: string | null; rowsImported: number } | null;
	templates: {
		id: number;
		name: string;
		mapping: Record<string, number | null>;
		options: Record<string, unknown>;
	}[];
}

export interface Status {
	id: number;
	state: string;
	rowsImported: number;
	rowsRejected: number;
	errorMessage: string | null;
	warnings: string[];
	hasRejectedRows: boolean;
	progress: { rowsRead: number; fraction: number } | null;
}

/** A file upload's headers: the server ignores a body sent without a Content-Type. */
export function fileHeaders(file: File): Record<string, string> {
	return { accept: 'application/json', 'content-type': file.type || 'application/octet-stream' };
}

/** Reads an API answer; an error answer becomes an Error with the server's own message. */
export async function answer<T>(response: Response): Promise<T> {
	const body = await response.json().catch(() => null);
	if (!response.ok)
		throw new Error(body?.error?.message ?? `The server answered ${response.status}.`);
	return body as T;
}

export async function uploadFile(
	surveyId: number,
	file: File,
	kind: ImportKind = 'readings'
): Promise<Upload> {
	const url = `/api/v1/surveys/${surveyId}/imports?kind=${kind}&fileName=${encodeURIComponent(file.name)}`;
	return answer(await fetch(url, { method: 'POST', body: file, headers: fileHeaders(file) }));
}

export async function postJson<T>(url: string, body: unknown): Promise<T> {
	return answer(
		await fetch(url, {
			method: 'POST',
			body: JSON.stringify(body),
			headers: { 'content-type': 'application/json', accept: 'application/json' }
		})
	);
}

export async function status(batchId: number): Promise<Status> {
	return (await answer<{ import: Status }>(await fetch(`/api/v1/imports/${batchId}`))).import;
}
