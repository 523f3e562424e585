import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import * as checks from '$lib/server/db/checks';
import { requireUser } from '$lib/server/guard';

/** The latest check of each asset, newest first. */
export const GET: RequestHandler = (event) => {
	requireUser(event);
	return json({ checks: checks.latestPerAsset() }, { headers: { 'cache-control': 'no-store' } });
};
