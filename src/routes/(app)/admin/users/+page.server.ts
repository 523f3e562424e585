import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import * as users from '$lib/server/db/users';
import { endAllSessions, hashPassword, signInPause, unlockSignIn } from '$lib/server/auth';
import { requireUser } from '$lib/server/guard';
import { createUserForm, resetPasswordForm, updateUserForm, userIdForm } from '$lib/schemas/user';
import { fieldErrors, formToObject } from '$lib/schemas/form';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	return {
		users: users.list().map((u) => ({ ...u, signIn: signInPause(u.email) })),
		sites: users.allSites()
	};
};

/** Maps the domain errors of the users module to form failures. */
function domainFailure(action: string, id: string | null, e: unknown) {
	if (e instanceof users.LastAdminError)
		return fail(409, { action, id, errors: { form: e.message } });
	if (e instanceof users.DuplicateEmailError)
		return fail(409, { action, id, errors: { email: e.message } });
	if (e instanceof users.UnknownUserError)
		return fail(404, { action, id, errors: { form: e.message } });
	if (e instanceof users.UnknownSiteError)
		return fail(400, { action, id, errors: { siteIds: e.message } });
	throw e;
}

/** Disables (ending its sessions) or enables an account. */
async function setDisabled(event: RequestEvent, disabled: boolean) {
	const action = disabled ? 'disable' : 'enable';
	const actor = requireUser(event);
	const parsed = userIdForm.safeParse(formToObject(await event.request.formData()));
	if (!parsed.success) return fail(400, { action, id: null, errors: fieldErrors(parsed.error) });
	try {
		users.setDisabled(parsed.data.id, disabled, actor.id);
		if (disabled) await endAllSessions(parsed.data.id);
	} catch (e) {
		return domainFailure(action, parsed.data.id, e);
	}
	return {
		action,
		id: parsed.data.id,
		done: disabled ? 'Account disabled; its sessions are ended.' : 'Account enabled.'
	};
}

export const actions: Actions = {
	create: async (event) => {
		const actor = requireUser(event);
		const raw = formToObject(await event.request.formData(), ['siteIds']);
		const parsed = createUserForm.safeParse(raw);
		const values = {
			name: String(raw.name ?? ''),
			email: String(raw.email ?? ''),
			role: String(raw.role ?? '')
		};
		if (!parsed.success)
			return fail(400, { action: 'create', id: null, values, errors: fieldErrors(parsed.error) });
		try {
			users.create(
				{ ...parsed.data, passwordHash: await hashPassword(parsed.data.password) },
				actor.id
			);
		} catch (e) {
			return domainFailure('create', null, e);
		}
		return { action: 'create', id: null, done: `Account for ${parsed.data.email} created.` };
	},
	update: async (event) => {
		const actor = requireUser(event);
		const parsed = updateUserForm.safeParse(
			formToObject(await event.request.formData(), ['siteIds'])
		);
		if (!parsed.success)
			return fail(400, { action: 'update', id: null, errors: fieldErrors(parsed.error) });
		try {
			users.update(
				parsed.data.id,
				{ role: parsed.data.role, siteIds: parsed.data.siteIds },
				actor.id
			);
		} catch (e) {
			return domainFailure('update', parsed.data.id, e);
		}
		return { action: 'update', id: parsed.data.id, done: 'Saved.' };
	},
	/** Lifts an account's sign-in wait after failed attempts (the holder called for help). */
	unlock: async (event) => {
		const actor = requireUser(event);
		const parsed = userIdForm.safeParse(formToObject(await event.request.formData()));
		if (!parsed.success)
			return fail(400, { action: 'unlock', id: null, errors: fieldErrors(parsed.error) });
		const u = users.byId(parsed.data.id);
		if (!u)
			return fail(404, { action: 'unlock', id: parsed.data.id, errors: { form: 'No such user.' } });
		unlockSignIn(u.email);
		console.log(`[detune] sign-in of ${u.email} unlocked by ${actor.email}`);
		return { action: 'unlock', id: u.id, done: 'Sign-in unlocked: they can sign in now.' };
	},
	disable: (event) => setDisabled(event, true),
	enable: (event) => setDisabled(event, false),
	reset: async (event) => {
		const actor = requireUser(event);
		const raw = formToObject(await event.request.formData());
		const parsed = resetPasswordForm.safeParse(raw);
		if (!parsed.success)
			return fail(400, {
				action: 'reset',
				id: String(raw.id ?? ''),
				errors: fieldErrors(parsed.error)
			});
		try {
			users.setPasswordHash(parsed.data.id, await hashPassword(parsed.data.password), actor.id);
		} catch (e) {
			return domainFailure('reset', parsed.data.id, e);
		}
		await endAllSessions(parsed.data.id);
		return {
			action: 'reset',
			id: parsed.data.id,
			done: 'Password reset; the user signs in again with the new one.'
		};
	}
};
