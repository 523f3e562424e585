import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { sqlite } from '$lib/server/db';
import { authorize } from '$lib/server/guard';
import { health } from '$lib/server/health';
import { dataDir } from '$lib/server/recordings';

/** Readiness for load balancers, monitors and the test runner: 503 with what is wrong. */
export const GET: RequestHandler = (event) => {
	authorize(event);
	const h = health(sqlite, dataDir());
	return json(h, { status: h.ok ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
