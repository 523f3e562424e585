import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guard';

/** Floor check renders from the tablet's IndexedDB; the server only checks who may open it. */
export const load: PageServerLoad = (event) => {
	requireUser(event);
	return {};
};
