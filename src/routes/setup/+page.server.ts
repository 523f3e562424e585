import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { authorize } from '$lib/server/guard';
import { closeSetup, setupAllowed } from '$lib/server/setup';
import { hashPassword } from '$lib/server/auth';
import * as users from '$lib/server/db/users';
import { createUserForm } from '$lib/schemas/user';
import { fieldErrors } from '$lib/schemas/form';

// a 404, as for any link that leads nowhere: the link is spent, wrong or from an earlier start
const refused = () =>
	error(404, {
		message:
			'This setup link is not valid: an admin exists already, or the server has restarted since it printed the link.',
		code: 'setup-closed'
	});

/** The first admin of a new installation, from the one-time link the server printed. */
export const load: PageServerLoad = (event) => {
	authorize(event);
	if (!setupAllowed(event.url.searchParams.get('token'))) refused();
	return { token: event.url.searchParams.get('token') };
};

export const actions: Actions = {
	default: async (event) => {
		authorize(event);
		const form = await event.request.formData();
		if (!setupAllowed(String(form.get('token') ?? ''))) refused();
		const parsed = createUserForm.safeParse({
			name: form.get('name'),
			email: form.get('email'),
			role: 'admin',
			password: form.get('password'),
			siteIds: []
		});
		if (!parsed.success)
			return fail(400, {
				name: String(form.get('name') ?? '').slice(0, 100),
				email: String(form.get('email') ?? '').slice(0, 254),
				errors: fieldErrors(parsed.error)
			});
		users.create({ ...parsed.data, passwordHash: await hashPassword(parsed.data.password) }, null);
		closeSetup();
		console.log(`[detune] first admin created: ${parsed.data.email}; the setup link is closed`);
		redirect(303, '/login');
	}
};
