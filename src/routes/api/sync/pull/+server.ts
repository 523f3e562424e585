import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { pull } from '$lib/server/sync/pull';
import { parsePullQuery } from '$lib/schemas/sync';

/** GET /api/sync/pull?since=<cursor>&scope=<key> — see DEVELOPERS.md, "Sync API". */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const query = parsePullQuery(event.url.searchParams);
	if (!query.success) {
		const issue = query.error.issues[0];
		error(400, {
			message: issue.message,
			code: issue.path[0] === 'scope' ? 'bad-scope' : 'bad-cursor'
		});
	}
	return json(pull(user, query.data.since, query.data.scope), {
		headers: { 'cache-control': 'no-store' }
	});
};
