import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { homeFor } from '$lib/access';
import { authorize } from '$lib/server/guard';

/** The root sends each role to its own start page. */
export const load: PageServerLoad = (event) => {
	const user = authorize(event);
	redirect(303, user ? homeFor(user.role) : '/login');
};
