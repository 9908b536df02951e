import { openDB, type DBSchema, type IDBPDatabase } from 'idb';

/**
 * Site entries kept on the device until the server has them: IndexedDB, which outlives a reload,
 * a closed tab and a lost signal. Each entry has an id made here; readings and holes are sent
 * in batches whose id is fixed before the first try, so a retried send is the same batch.
 *
 * A tablet is often shared by a site team. Each entry remembers who made it, and only that person's
 * session sends it: readings are never saved under the name of whoever signs in next. Entries kept
 * before entries carried a maker (no `userId`) go with the first person who opens their survey.
 */
export type EntryKind = 'reading' | 'hole' | 'photo';
export type EntryState = 'waiting' | 'refused';

export interface ReadingData {
	x: string;
	y: string;
	cover: string;
	diameter: string;
	direction: string;
	note: string;
}
export interface HoleData {
	label: string;
	xMm: string;
	yMm: string;
	meterReadingMm: string;
	measuredCoverMm: string;
	method: string;
}
export interface PhotoData {
	blob: Blob;
	fileName: string;
	caption: string;
}

interface EntryBase {
	clientId: string;
	/** Who made the entry (the signed-in user's id); absent on entries kept before makers were kept. */
	userId?: number;
	surveyId: number;
	memberId: number;
	memberLabel: string;
	createdAt: number;
	state: EntryState;
	/** The batch this entry was first sent in; kept until the server has answered for it. */
	batchId: string | null;
	refusal: string | null;
}
export type SiteEntry =
	| (EntryBase & { kind: 'reading'; data: ReadingData })
	| (EntryBase & { kind: 'hole'; data: HoleData })
	| (EntryBase & { kind: 'photo'; data: PhotoData });

interface SiteDb extends DBSchema {
	entries: { key: string; value: SiteEntry; indexes: { bySurvey: number } };
}

let opened: Promise<IDBPDatabase<SiteDb>> | null = null;
function db() {
	opened ??= openDB<SiteDb>('fractile-site', 1, {
		upgrade(database) {
			const store = database.createObjectStore('entries', { keyPath: 'clientId' });
			store.createIndex('bySurvey', 'surveyId');
		}
	});
	return opened;
}

const madeBy = (e: SiteEntry, userId: number) => e.userId === undefined || e.userId === userId;

/** A survey's entries made by this person, oldest first, and how many others made here wait. */
export async function entriesOf(
	surveyId: number,
	userId: number
): Promise<{ own: SiteEntry[]; othersWaiting: number }> {
	const all = await (await db()).getAllFromIndex('entries', 'bySurvey', surveyId);
	const own = all.filter((e) => madeBy(e, userId)).sort((a, b) => a.createdAt - b.createdAt);
	return { own, othersWaiting: all.length - own.length };
}

/** Every entry on this device that has not reached the server, whoever made it. */
export async function waitingOnDevice(): Promise<number> {
	return (await (await db()).getAll('entries')).length;
}

type NewEntry =
	| { kind: 'reading'; data: ReadingData }
	| { kind: 'hole'; data: HoleData }
	| { kind: 'photo'; data: PhotoData };

export async function addEntry(
	surveyId: number,
	userId: number,
	member: { id: number; label: string },
	entry: NewEntry
): Promise<SiteEntry> {
	const row = {
		...entry,
		clientId: crypto.randomUUID(),
		userId,
		surveyId,
		memberId: member.id,
		memberLabel: member.label,
		createdAt: Date.now(),
		state: 'waiting',
		batchId: null,
		refusal: null
	} as SiteEntry;
	await (await db()).put('entries', row);
	return row;
}

export async function removeEntries(clientIds: string[]): Promise<void> {
	const tx = (await db()).transaction('entries', 'readwrite');
	await Promise.all([...clientIds.map((id) => tx.store.delete(id)), tx.done]);
}

/**
 * The readings and holes to send next, under one batch id. An unanswered batch goes again as it
 * was (same id, same entries); only when none is open are the waiting entries given a new id.
 */
export async function nextBatch(
	surveyId: number,
	userId: number
): Promise<{ batchId: string; entries: SiteEntry[] } | null> {
	const tx = (await db()).transaction('entries', 'readwrite');
	const all = await tx.store.index('bySurvey').getAll(surveyId);
	const sendable = all.filter(
		(e) => e.kind !== 'photo' && e.state === 'waiting' && madeBy(e, userId)
	);
	const open = sendable.find((e) => e.batchId);
	let batch: SiteEntry[];
	let batchId: string;
	if (open) {
		batchId = open.batchId!;
		batch = sendable.filter((e) => e.batchId === batchId);
	} else {
		batchId = crypto.randomUUID();
		// An entry from before makers were kept becomes this person's as it is sent.
		batch = sendable.slice(0, 5000).map((e) => ({ ...e, batchId, userId }));
		await Promise.all(batch.map((e) => tx.store.put(e)));
	}
	await tx.done;
	return batch.length ? { batchId, entries: batch } : null;
}

export async function markRefused(clientIds: string[], reason: string): Promise<void> {
	const tx = (await db()).transaction('entries', 'readwrite');
	for (const id of clientIds) {
		const e = await tx.store.get(id);
		if (e) await tx.store.put({ ...e, state: 'refused', refusal: reason });
	}
	await tx.done;
}
