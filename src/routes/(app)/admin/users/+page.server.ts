import type { Actions, PageServerLoad, RequestEvent } from './$types';
import * as users from '$lib/server/db/users';
import { endAllSessions, hashPassword, signInPause, unlockSignIn } from '$lib/server/auth';
import { requireUser } from '$lib/server/guard';
import { createUserForm, resetPasswordForm, updateUserForm, userIdForm } from '$lib/schemas/user';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	return {
		users: users.list().map((u) => ({ ...u, signIn: signInPause(u.email) })),
		sites: users.allSites()
	};
};

/** Maps the domain errors of the users module to form failures. */
function domainFailure(action: string, id: string | null, e: unknown) {
	if (e instanceof users.LastAdminError) return failAction(409, action, id, { form: e.message });
	if (e instanceof users.DuplicateEmailError)
		return failAction(409, action, id, { email: e.message });
	if (e instanceof users.UnknownUserError) return failAction(404, action, id, { form: e.message });
	if (e instanceof users.UnknownSiteError)
		return failAction(400, action, id, { siteIds: e.message });
	throw e;
}

/** Disables (ending its sessions) or enables an account. */
async function setDisabled(event: RequestEvent, disabled: boolean) {
	const action = disabled ? 'disable' : 'enable';
	const actor = requireUser(event);
	const parsed = userIdForm.safeParse(formToObject(await event.request.formData()));
	if (!parsed.success) return failAction(400, action, null, fieldErrors(parsed.error));
	try {
		users.setDisabled(parsed.data.id, disabled, actor.id);
		if (disabled) await endAllSessions(parsed.data.id);
	} catch (e) {
		return domainFailure(action, parsed.data.id, e);
	}
	return doneAction(
		action,
		parsed.data.id,
		disabled ? 'Account disabled; its sessions are ended.' : 'Account enabled.'
	);
}

export const actions: Actions = {
	create: async (event) => {
		const actor = requireUser(event);
		const raw = formToObject(await event.request.formData(), ['siteIds']);
		const parsed = createUserForm.safeParse(raw);
		if (!parsed.success) return failAction(400, 'create', null, fieldErrors(parsed.error), raw);
		try {
			users.create(
				{ ...parsed.data, passwordHash: await hashPassword(parsed.data.password) },
				actor.id
			);
		} catch (e) {
			return domainFailure('create', null, e);
		}
		return doneAction('create', null, `Account for ${parsed.data.email} created.`);
	},
	update: async (event) => {
		const actor = requireUser(event);
		const parsed = updateUserForm.safeParse(
			formToObject(await event.request.formData(), ['siteIds'])
		);
		if (!parsed.success) return failAction(400, 'update', null, fieldErrors(parsed.error));
		try {
			users.update(
				parsed.data.id,
				{ role: parsed.data.role, siteIds: parsed.data.siteIds },
				actor.id
			);
		} catch (e) {
			return domainFailure('update', parsed.data.id, e);
		}
		return doneAction('update', parsed.data.id, 'Saved.');
	},
	/** Lifts an account's sign-in wait after failed attempts (the holder called for help). */
	unlock: async (event) => {
		const actor = requireUser(event);
		const parsed = userIdForm.safeParse(formToObject(await event.request.formData()));
		if (!parsed.success) return failAction(400, 'unlock', null, fieldErrors(parsed.error));
		const u = users.byId(parsed.data.id);
		if (!u) return failAction(404, 'unlock', parsed.data.id, { form: 'No such user.' });
		unlockSignIn(u.email);
		console.log(`[detune] sign-in of ${u.email} unlocked by ${actor.email}`);
		return doneAction('unlock', u.id, 'Sign-in unlocked: they can sign in now.');
	},
	disable: (event) => setDisabled(event, true),
	enable: (event) => setDisabled(event, false),
	reset: async (event) => {
		const actor = requireUser(event);
		const raw = formToObject(await event.request.formData());
		const parsed = resetPasswordForm.safeParse(raw);
		if (!parsed.success)
			return failAction(400, 'reset', String(raw.id ?? ''), fieldErrors(parsed.error));
		try {
			users.setPasswordHash(parsed.data.id, await hashPassword(parsed.data.password), actor.id);
		} catch (e) {
			return domainFailure('reset', parsed.data.id, e);
		}
		await endAllSessions(parsed.data.id);
		return doneAction(
			'reset',
			parsed.data.id,
			'Password reset; the user signs in again with the new one.'
		);
	}
};
