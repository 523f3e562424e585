import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { endSession } from '$lib/server/auth';
import { authorize } from '$lib/server/guard';

/** Sign-out is a POST (a form action) so that a link or prefetch can never sign anyone out. */
export const load: PageServerLoad = (event) => {
	authorize(event);
	redirect(303, '/');
};

export const actions: Actions = {
	default: async (event) => {
		authorize(event);
		if (event.locals.session) {
			const cookie = await endSession(event.locals.session.id);
			event.cookies.set(cookie.name, cookie.value, { path: '/', ...cookie.attributes });
		}
		redirect(303, '/login');
	}
};
