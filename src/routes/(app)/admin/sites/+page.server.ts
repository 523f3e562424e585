import type { z } from 'zod';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as siteQueries from '$lib/server/db/sites';
import { areaCreate, areaRename, siteForm, siteUpdate } from '$lib/schemas/site';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	return { sites: siteQueries.list() };
};

/**
 * Every action here: an admin's form, parsed; on success `run` answers the message; a bad form or
 * a SiteError comes back as field messages under the row it belongs to (`idKey` names that row).
 */
async function act<S extends z.ZodType<Record<string, unknown>>>(
	event: RequestEvent,
	action: string,
	schema: S,
	idKey: string,
	run: (data: z.infer<S>, actorId: string) => string
) {
	const actor = requireRole(event, ['admin']);
	const raw = formToObject(await event.request.formData());
	const id = idKey === 'new' ? 'new' : String(raw[idKey] ?? '');
	const parsed = schema.safeParse(raw);
	if (!parsed.success) return failAction(400, action, id, fieldErrors(parsed.error), raw);
	try {
		return doneAction(action, id, run(parsed.data, actor.id));
	} catch (e) {
		if (e instanceof siteQueries.SiteError)
			return failAction(e.status, action, id, { [e.field]: e.message }, raw);
		throw e;
	}
}

export const actions: Actions = {
	createSite: (event) =>
		act(event, 'createSite', siteForm, 'new', (form, actorId) => {
			siteQueries.createSite(form, actorId);
			return `Site ${form.code} added.`;
		}),
	updateSite: (event) =>
		act(event, 'updateSite', siteUpdate, 'id', ({ id, ...form }, actorId) => {
			const r = siteQueries.updateSite(id, form, actorId);
			if (!r.changed) return 'Nothing changed.';
			return r.restaled
				? `Saved; the stale date of ${r.restaled} asset${r.restaled === 1 ? '' : 's'} moved with the new interval.`
				: 'Saved.';
		}),
	addArea: (event) =>
		act(event, 'addArea', areaCreate, 'siteId', ({ siteId, name }, actorId) => {
			siteQueries.createArea(siteId, name, actorId);
			return `Area ${name} added.`;
		}),
	renameArea: (event) =>
		act(event, 'renameArea', areaRename, 'id', ({ id, name }, actorId) =>
			siteQueries.renameArea(id, name, actorId) ? 'Area renamed.' : 'Nothing changed.'
		)
};
