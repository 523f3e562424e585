import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as followUps from '$lib/server/db/follow-ups';
import * as users from '$lib/server/db/users';
import * as assetQueries from '$lib/server/db/assets';
import { followUpCreate, followUpMove, followUpUpdate } from '$lib/schemas/follow-up';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { send } from '$lib/server/mail';
import { followUpMail } from '$lib/server/mail/messages';
import { runReminders } from '$lib/server/mail/reminders';
import { canPlan, PLANNERS } from '$lib/roles';
import { readableAsset } from '$lib/server/scope';

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	const q = event.url.searchParams;
	const today = new Date().toISOString().slice(0, 10);
	const filter = {
		status: q.get('status') || undefined,
		assigneeId: user.role === 'technician' ? user.id : q.get('assignee') || undefined,
		overdueOn: q.get('overdue') === 'yes' ? today : undefined
	};
	const planner = canPlan(user.role);
	// the form to raise one from a flagged check: planners only, and only for an asset they may read
	const newFor = planner ? q.get('new') : null;
	const prefillAsset = newFor ? readableAsset(user, newFor) : null;
	return {
		today,
		canPlan: planner,
		items: followUps.list(filter),
		// names and e-mail addresses go to those who assign, never to everyone
		assignees: planner ? users.byRole('technician').concat(users.byRole('supervisor')) : [],
		assets: planner
			? assetQueries.listVisible(user).map((a) => ({ id: a.id, tag: a.tag, name: a.name }))
			: [],
		prefill: prefillAsset
			? {
					assetId: prefillAsset.id,
					checkId: q.get('check') ?? '',
					remedy: followUps.suggestRemedy(q.get('check'), prefillAsset.id)
				}
			: null
	};
};

async function notifyAssignee(id: string) {
	const f = followUps.byId(id);
	if (f?.assigneeEmail)
		await send({
			...followUpMail('assignment', f),
			to: f.assigneeEmail,
			dedupeKey: `assignment:${f.id}:${f.assigneeId}`
		});
}

export const actions: Actions = {
	create: async (event) => {
		const actor = requireRole(event, PLANNERS);
		const raw = formToObject(await event.request.formData());
		const parsed = followUpCreate.safeParse(raw);
		if (!parsed.success)
			return fail(400, { action: 'create', id: 'new', errors: fieldErrors(parsed.error) });
		try {
			const id = followUps.create(parsed.data, actor.id);
			if (parsed.data.assigneeId) await notifyAssignee(id);
			return {
				action: 'create',
				id: 'new',
				done:
					'Follow-up created.' + (parsed.data.assigneeId ? ' The assignee has been e-mailed.' : '')
			};
		} catch (e) {
			if (e instanceof followUps.FollowUpError)
				return fail(400, { action: 'create', id: 'new', errors: { form: e.message } });
			throw e;
		}
	},
	update: async (event) => {
		const actor = requireRole(event, PLANNERS);
		const raw = formToObject(await event.request.formData());
		const parsed = followUpUpdate.safeParse(raw);
		if (!parsed.success)
			return fail(400, {
				action: 'update',
				id: String(raw.id ?? ''),
				errors: fieldErrors(parsed.error)
			});
		try {
			const r = followUps.update(parsed.data, actor.id);
			if (r.assigneeChanged) await notifyAssignee(parsed.data.id);
			return {
				action: 'update',
				id: parsed.data.id,
				done: 'Saved.' + (r.assigneeChanged ? ' The assignee has been e-mailed.' : '')
			};
		} catch (e) {
			if (e instanceof followUps.FollowUpError)
				return fail(400, { action: 'update', id: parsed.data.id, errors: { form: e.message } });
			throw e;
		}
	},
	move: async (event) => {
		const actor = requireRole(event, PLANNERS);
		const parsed = followUpMove.safeParse(formToObject(await event.request.formData()));
		if (!parsed.success)
			return fail(400, { action: 'move', id: '', errors: fieldErrors(parsed.error) });
		try {
			followUps.move(parsed.data.id, parsed.data.status, actor.id);
		} catch (e) {
			if (e instanceof followUps.FollowUpError)
				return fail(400, { action: 'move', id: parsed.data.id, errors: { form: e.message } });
			throw e;
		}
		return { action: 'move', id: parsed.data.id, done: `Marked ${parsed.data.status}.` };
	},
	remind: async (event) => {
		requireRole(event, PLANNERS);
		const r = await runReminders();
		return {
			action: 'remind',
			id: 'all',
			done: `Reminders: ${r.sent} sent, ${r.skipped} already sent before.`
		};
	}
};
