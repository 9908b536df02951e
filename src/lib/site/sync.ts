import { entriesOf, markRefused, nextBatch, removeEntries, type SiteEntry } from './queue';

export type SyncStop =
	| { state: 'done'; sent: number }
	| { state: 'offline' }
	| { state: 'sign-in' }
	| { state: 'refused'; reason: string }
	| { state: 'error'; reason: string };

function bodyOf(batchId: string, entries: SiteEntry[]) {
	const readings = [];
	const holes = [];
	for (const e of entries) {
		if (e.kind === 'reading')
			readings.push({ memberId: e.memberId, clientId: e.clientId, ...e.data });
		if (e.kind === 'hole') holes.push({ memberId: e.memberId, clientId: e.clientId, ...e.data });
	}
	return JSON.stringify({ batchId, units: 'mm', readings, holes });
}

async function reasonOf(response: Response): Promise<string> {
	const body = await response.json().catch(() => null);
	return body?.error?.message ?? `The server answered ${response.status}.`;
}

/** What to do with the server's answer to a send: null to go on, else why the sync stops. */
async function settle(response: Response, clientIds: string[]): Promise<SyncStop | null> {
	if (response.ok) {
		await removeEntries(clientIds);
		return null;
	}
	// The session ended (expired, or signed out elsewhere): keep everything, ask for a sign-in.
	if (response.status === 401) return { state: 'sign-in' };
	// The server has looked at the entries and will not take them (a submitted or frozen survey,
	// a reading that fails its checks): they stay on the device, marked with the reason.
	if (response.status === 409 || response.status === 400 || response.status === 403) {
		const reason = await reasonOf(response);
		await markRefused(clientIds, reason);
		return { state: 'refused', reason };
	}
	return { state: 'error', reason: await reasonOf(response) };
}

/**
 * Sends a survey's waiting entries: readings and holes in batches under their fixed batch id,
 * then each photo under its own id. Stops at the first thing that needs a person. Only the
 * entries this person made are sent (see queue.ts).
 */
export async function syncSurvey(surveyId: number, userId: number): Promise<SyncStop> {
	let sent = 0;
	try {
		for (
			let batch = await nextBatch(surveyId, userId);
			batch;
			batch = await nextBatch(surveyId, userId)
		) {
			const response = await fetch(`/api/v1/surveys/${surveyId}/site-sync`, {
				method: 'POST',
				headers: { 'content-type': 'application/json', accept: 'application/json' },
				body: bodyOf(batch.batchId, batch.entries)
			});
			const stop = await settle(
				response,
				batch.entries.map((e) => e.clientId)
			);
			if (stop) return stop;
			sent += batch.entries.length;
		}
		const photos = (await entriesOf(surveyId, userId)).own.filter(
			(e) => e.kind === 'photo' && e.state === 'waiting'
		);
		for (const p of photos) {
			if (p.kind !== 'photo') continue;
			const query = new URLSearchParams({
				clientId: p.clientId,
				memberId: String(p.memberId),
				fileName: p.data.fileName,
				caption: p.data.caption
			});
			const response = await fetch(`/api/v1/surveys/${surveyId}/site-sync/photos?${query}`, {
				method: 'POST',
				headers: { 'content-type': p.data.blob.type || 'application/octet-stream' },
				body: p.data.blob
			});
			const stop = await settle(response, [p.clientId]);
			if (stop) return stop;
			sent++;
		}
	} catch {
		return { state: 'offline' }; // fetch itself failed: no network; the entries wait
	}
	return { state: 'done', sent };
}
