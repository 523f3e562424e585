import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guard';
import * as assetQueries from '$lib/server/db/assets';
import * as checkQueries from '$lib/server/db/checks';
import * as recordingQueries from '$lib/server/db/recordings';

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	const sheet = assetQueries.sheet(event.params.assetId);
	const scope = assetQueries.visibleSiteIds(user);
	if (!sheet || (scope !== 'all' && !scope.includes(sheet.asset.siteId))) error(404, { message: 'No such asset on your sites.', code: 'not-found' });
	const history = checkQueries.forAsset(sheet.asset.id).map((c) => ({ ...c, modes: checkQueries.modesOf(c.id), result: undefined }));
	return { ...sheet, history, recordings: recordingQueries.forAsset(sheet.asset.id) };
};
