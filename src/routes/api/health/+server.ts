import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { sqlite } from '$lib/server/db';
import { authorize } from '$lib/server/guard';

/** Liveness for load balancers and the test runner: the database answers. */
export const GET: RequestHandler = (event) => {
	authorize(event);
	const row = sqlite.prepare('select 1 as ok').get() as { ok: number };
	return json({ ok: row.ok === 1 }, { headers: { 'cache-control': 'no-store' } });
};
