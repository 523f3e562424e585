import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { homeFor } from '$lib/access';
import { createSession, endSession, signIn } from '$lib/server/auth';
import { authorize } from '$lib/server/guard';
import { safeNext } from '$lib/server/auth/next';
import { signInForm } from '$lib/schemas/user';
import { fieldErrors } from '$lib/schemas/form';

/**
 * The same page for everyone, signed in or not: the service worker keeps a copy so that a tablet
 * can show it offline (after a sign-out on the floor), so it must not depend on the session.
 */
export const load: PageServerLoad = (event) => {
	authorize(event);
	return { next: safeNext(event.url.searchParams.get('next')) };
};

export const actions: Actions = {
	default: async (event) => {
		authorize(event);
		const form = await event.request.formData();
		const raw = { email: form.get('email'), password: form.get('password') };
		const parsed = signInForm.safeParse(raw);
		const email = typeof raw.email === 'string' ? raw.email.slice(0, 254) : '';
		if (!parsed.success)
			return fail(400, { email, errors: fieldErrors(parsed.error), message: null });
		const result = await signIn(parsed.data.email, parsed.data.password, event.getClientAddress());
		if (!result.ok)
			return fail(result.retryAfterS ? 429 : 400, {
				email,
				errors: {} as Record<string, string>,
				message: result.message
			});
		// a session this browser still holds (a sign-out on a tablet that was offline) ends here
		if (event.locals.session) await endSession(event.locals.session.id);
		const cookie = await createSession(result.userId);
		event.cookies.set(cookie.name, cookie.value, { path: '/', ...cookie.attributes });
		redirect(303, safeNext(String(form.get('next') ?? '')) ?? homeFor(result.role));
	}
};
