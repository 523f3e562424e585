import type { PageServerLoad } from './$types';
import * as assets from '$lib/server/db/assets';
import * as checks from '$lib/server/db/checks';
import { requireUser } from '$lib/server/guard';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	return { counts: assets.counts(), latest: checks.latestPerAsset() };
};
