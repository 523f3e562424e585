import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guard';
import * as audit from '$lib/server/db/audit';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	return { entries: audit.recent(300) };
};
