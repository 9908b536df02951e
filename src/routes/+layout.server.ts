import type { LayoutServerLoad } from './$types';

/** Only whether someone is signed in, for the header's one link. */
export const load: LayoutServerLoad = ({ locals }) => ({ signedIn: locals.user !== null });
