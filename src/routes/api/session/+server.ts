import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';

/**
 * GET /api/session — who is signed in, for the tablet: Floor check renders from IndexedDB and
 * opens the store of this user (a 401 means nobody is, and the tablet asks for sign-in).
 */
export const GET: RequestHandler = (event) => {
	const u = requireUser(event);
	return json(
		{
			id: u.id,
			name: u.name,
			email: u.email,
			role: u.role,
			unitSystem: u.unitSystem,
			frequencyUnit: u.frequencyUnit
		},
		{ headers: { 'cache-control': 'no-store' } }
	);
};
