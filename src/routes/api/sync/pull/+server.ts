import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { pull } from '$lib/server/sync/pull';

/** GET /api/sync/pull?since=<cursor>&scope=<key> — see DEVELOPERS.md, "Sync API". */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const raw = event.url.searchParams.get('since') ?? '0';
	if (!/^\d{1,15}$/.test(raw))
		error(400, {
			message: 'since must be a whole number (the cursor of the last pull, or 0).',
			code: 'bad-cursor'
		});
	const scope = event.url.searchParams.get('scope');
	if (scope !== null && !/^[0-9a-f]{16}$/.test(scope))
		error(400, { message: 'scope must be the key of the last pull.', code: 'bad-scope' });
	return json(pull(user, Number(raw), scope), { headers: { 'cache-control': 'no-store' } });
};
