import type { PageServerLoad } from './$types';
import * as assets from '$lib/server/db/assets';
import { requireUser } from '$lib/server/guard';

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	return { assets: assets.listVisible(user) };
};
