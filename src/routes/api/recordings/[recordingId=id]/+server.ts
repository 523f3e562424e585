import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import * as assetQueries from '$lib/server/db/assets';
import * as recordingQueries from '$lib/server/db/recordings';
import { readStored } from '$lib/server/recordings';

/** GET: the original file, as a download — never served as something a browser would run. */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const rec = recordingQueries.byId(event.params.recordingId);
	const asset = rec ? assetQueries.byId(rec.assetId) : undefined;
	const scope = assetQueries.visibleSiteIds(user);
	if (!rec || !asset || !assetQueries.inScope(scope, asset.siteId))
		error(404, { message: 'No such recording.', code: 'not-found' });
	const body = readStored(rec.sha256);
	const safeName = rec.fileName.replace(/[^\w.\- ]/g, '_');
	return new Response(new Uint8Array(body), {
		headers: {
			'content-type': rec.mediaType === 'audio/wav' ? 'audio/wav' : 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${safeName}"`,
			'content-length': String(body.length),
			'x-content-type-options': 'nosniff',
			'cache-control': 'private, no-store'
		}
	});
};
