import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as siteQueries from '$lib/server/db/sites';
import { areaCreate, areaRename, siteForm, siteUpdate } from '$lib/schemas/site';
import { fieldErrors, formToObject } from '$lib/schemas/form';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	return { sites: siteQueries.list() };
};

function siteFailure(action: string, id: string, e: unknown) {
	if (e instanceof siteQueries.SiteError) return fail(e.status, { action, id, errors: { [e.field]: e.message } });
	throw e;
}

export const actions: Actions = {
	createSite: async (event) => {
		const actor = requireRole(event, ['admin']);
		const raw = formToObject(await event.request.formData());
		const parsed = siteForm.safeParse(raw);
		const values = { code: String(raw.code ?? ''), name: String(raw.name ?? ''), recheckDays: String(raw.recheckDays ?? '') };
		if (!parsed.success) return fail(400, { action: 'createSite', id: 'new', values, errors: fieldErrors(parsed.error) });
		try {
			siteQueries.createSite(parsed.data, actor.id);
		} catch (e) {
			return siteFailure('createSite', 'new', e);
		}
		return { action: 'createSite', id: 'new', done: `Site ${parsed.data.code} added.` };
	},
	updateSite: async (event) => {
		const actor = requireRole(event, ['admin']);
		const raw = formToObject(await event.request.formData());
		const parsed = siteUpdate.safeParse(raw);
		if (!parsed.success) return fail(400, { action: 'updateSite', id: String(raw.id ?? ''), errors: fieldErrors(parsed.error) });
		try {
			const { id, ...form } = parsed.data;
			const r = siteQueries.updateSite(id, form, actor.id);
			const done = !r.changed ? 'Nothing changed.' : r.restaled ? `Saved; the stale date of ${r.restaled} asset${r.restaled === 1 ? '' : 's'} moved with the new interval.` : 'Saved.';
			return { action: 'updateSite', id, done };
		} catch (e) {
			return siteFailure('updateSite', parsed.data.id, e);
		}
	},
	addArea: async (event) => {
		const actor = requireRole(event, ['admin']);
		const raw = formToObject(await event.request.formData());
		const parsed = areaCreate.safeParse(raw);
		if (!parsed.success) return fail(400, { action: 'addArea', id: String(raw.siteId ?? ''), errors: fieldErrors(parsed.error) });
		try {
			siteQueries.createArea(parsed.data.siteId, parsed.data.name, actor.id);
		} catch (e) {
			return siteFailure('addArea', parsed.data.siteId, e);
		}
		return { action: 'addArea', id: parsed.data.siteId, done: `Area ${parsed.data.name} added.` };
	},
	renameArea: async (event) => {
		const actor = requireRole(event, ['admin']);
		const raw = formToObject(await event.request.formData());
		const parsed = areaRename.safeParse(raw);
		if (!parsed.success) return fail(400, { action: 'renameArea', id: String(raw.id ?? ''), errors: fieldErrors(parsed.error) });
		try {
			const changed = siteQueries.renameArea(parsed.data.id, parsed.data.name, actor.id);
			return { action: 'renameArea', id: parsed.data.id, done: changed ? 'Area renamed.' : 'Nothing changed.' };
		} catch (e) {
			return siteFailure('renameArea', parsed.data.id, e);
		}
	}
};
