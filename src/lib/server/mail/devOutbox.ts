import { env } from '$env/dynamic/private';
import { User } from '../db/models';
import { readFakeOutbox, type FakeMail } from './fakeOutbox';

/**
 * The development outbox shows what the local SMTP fake received. It exists only where the
 * instance says explicitly that it is a development or demo one (DEV_OUTBOX=1, which
 * scripts/services.sh writes for `npm start` and the test instance) and the fake's folder is
 * set; production leaves DEV_OUTBOX unset and the page answers 404.
 */
export function devOutboxEnabled(): boolean {
	return env.DEV_OUTBOX === '1' && !!env.MAIL_FAKE_DIR;
}

/**
 * The mail addressed to this user only, and only what arrived since their account was made:
 * anyone can sign up on a demo instance, so showing anyone else's mail (a reset link, an
 * invitation) would hand over that account. Null when the outbox is off.
 */
export async function devOutboxFor(userId: number): Promise<FakeMail[] | null> {
	if (!devOutboxEnabled()) return null;
	const user = await User.findByPk(userId, { attributes: ['email', 'createdAt'] });
	if (!user) return [];
	return readFakeOutbox(env.MAIL_FAKE_DIR!, { to: user.email, since: user.createdAt });
}
