import { Op } from 'sequelize';
import { ImportBatch } from '../db/models';
import { removeStagedCopies } from './stagedCopies';

/**
 * A preview nobody imported within this time is expired: its file is removed and the batch
 * no longer shows as pending. A day leaves a preview over a lunch break or an evening; the
 * mapping a user wants to keep is saved as a template, not in a pending batch.
 */
export const PREVIEW_EXPIRES_AFTER_MS = 24 * 60 * 60 * 1000;
const HOURS = PREVIEW_EXPIRES_AFTER_MS / 3_600_000;
export const EXPIRED_MESSAGE = `The preview was not imported within ${HOURS} hours and has expired; its file was removed. Upload the file again to import it.`;

/**
 * Expires the previews older than PREVIEW_EXPIRES_AFTER_MS. Run on every upload and by each
 * app process at start-up and hourly, so no scheduler outside the app is needed; safe from
 * several processes at once (the change is conditional on the batch still being pending, and a
 * start that claimed it meanwhile wins). Returns how many it expired.
 */
export async function expireStalePreviews(nowMs: number = Date.now()): Promise<number> {
	const stale = await ImportBatch.findAll({
		attributes: ['id'],
		where: { state: 'pending', createdAt: { [Op.lt]: new Date(nowMs - PREVIEW_EXPIRES_AFTER_MS) } },
		order: [['id', 'ASC']],
		limit: 500
	});
	let expired = 0;
	for (const { id } of stale) {
		const [changed] = await ImportBatch.update(
			{ state: 'cancelled', errorMessage: EXPIRED_MESSAGE, finishedAt: new Date(nowMs) },
			{ where: { id, state: 'pending' } }
		);
		if (changed === 1) {
			expired++;
			await removeStagedCopies(id);
		}
	}
	return expired;
}
