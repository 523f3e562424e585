import { error, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as followUps from '$lib/server/db/follow-ups';
import * as users from '$lib/server/db/users';
import * as assetQueries from '$lib/server/db/assets';
import {
	followUpCreate,
	followUpMove,
	followUpReschedule,
	followUpUpdate,
	parseListQuery,
	pastDueProblem
} from '$lib/schemas/follow-up';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';
import { send } from '$lib/server/mail';
import { followUpMail } from '$lib/server/mail/messages';
import { runReminders } from '$lib/server/mail/reminders';
import { canPlan, PLANNERS } from '$lib/roles';
import { isoDay } from '$lib/format';
import { readableAsset, sitesOf } from '$lib/server/scope';

const today = () => new Date().toISOString().slice(0, 10);

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	const parsed = parseListQuery(event.url.searchParams);
	if (!parsed.success) error(400, parsed.error.issues[0].message);
	const q = parsed.data;
	const today = new Date().toISOString().slice(0, 10);
	const planner = canPlan(user.role);
	// the form to raise one from a flagged check: planners only, and only for an asset they may read
	const newFor = planner ? q.new : null;
	const prefillAsset = newFor ? readableAsset(user, newFor) : null;
	return {
		today,
		canPlan: planner,
		items: followUps.listFor(user, q, today),
		// flagged checks (conflict, tight, or overdue for a recheck) that no follow-up covers yet
		queue: planner ? followUps.planningQueue(user) : [],
		created: q.created ?? null,
		mailed: q.mailed === 'yes',
		// names and e-mail addresses go to those who assign, never to everyone; each with the sites
		// they may read, so the form offers only people of the chosen asset's site
		assignees: planner
			? users
					.byRole('technician')
					.concat(users.byRole('supervisor'))
					.map((u) => ({ ...u, sites: sitesOf(u) }))
			: [],
		assets: planner
			? assetQueries
					.listVisible(user)
					.map((a) => ({ id: a.id, tag: a.tag, name: a.name, siteId: a.siteId }))
			: [],
		prefill: prefillAsset
			? {
					assetId: prefillAsset.id,
					checkId: q.check ?? '',
					remedy: followUps.suggestRemedy(q.check ?? null, prefillAsset.id)
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
		if (!parsed.success) return failAction(400, 'create', 'new', fieldErrors(parsed.error), raw);
		const past = pastDueProblem(parsed.data.dueDate, today(), parsed.data.backdated);
		if (past) return failAction(400, 'create', 'new', { dueDate: past }, raw);
		let id: string;
		try {
			id = followUps.create(parsed.data, actor.id);
		} catch (e) {
			if (e instanceof followUps.FollowUpError)
				return failAction(e.status, 'create', 'new', { form: e.message }, raw);
			throw e;
		}
		if (parsed.data.assigneeId) await notifyAssignee(id);
		// the form closes (no second one by a second tap) and the list shows the new one
		redirect(303, `/follow-ups?created=${id}${parsed.data.assigneeId ? '&mailed=yes' : ''}`);
	},
	update: async (event) => {
		const actor = requireRole(event, PLANNERS);
		const raw = formToObject(await event.request.formData());
		const parsed = followUpUpdate.safeParse(raw);
		if (!parsed.success)
			return failAction(400, 'update', String(raw.id ?? ''), fieldErrors(parsed.error));
		const before = followUps.byId(parsed.data.id);
		const past =
			before && before.dueDate !== parsed.data.dueDate
				? pastDueProblem(parsed.data.dueDate, today(), parsed.data.backdated)
				: null;
		if (past) return failAction(400, 'update', parsed.data.id, { dueDate: past });
		try {
			const r = followUps.update(parsed.data, actor.id);
			if (r.assigneeChanged) await notifyAssignee(parsed.data.id);
			return doneAction(
				'update',
				parsed.data.id,
				'Saved.' + (r.assigneeChanged ? ' The assignee has been e-mailed.' : '')
			);
		} catch (e) {
			if (e instanceof followUps.FollowUpError)
				return failAction(e.status, 'update', parsed.data.id, { form: e.message });
			throw e;
		}
	},
	/** the week calendar: one follow-up to another day; the outcome shows above the calendar */
	reschedule: async (event) => {
		const actor = requireRole(event, PLANNERS);
		const raw = formToObject(await event.request.formData());
		const parsed = followUpReschedule.safeParse(raw);
		if (!parsed.success)
			return failAction(400, 'reschedule', 'calendar', fieldErrors(parsed.error));
		const { id, dueDate } = parsed.data;
		const past = pastDueProblem(dueDate, today(), false);
		if (past) return failAction(400, 'reschedule', 'calendar', { dueDate: past });
		try {
			const before = followUps.reschedule(id, dueDate, actor.id);
			return doneAction(
				'reschedule',
				'calendar',
				`${before.tag} “${before.title}” is now due ${isoDay(dueDate)}.`
			);
		} catch (e) {
			if (e instanceof followUps.FollowUpError)
				return failAction(e.status, 'reschedule', 'calendar', { form: e.message });
			throw e;
		}
	},
	move: async (event) => {
		const actor = requireRole(event, PLANNERS);
		const raw = formToObject(await event.request.formData());
		const parsed = followUpMove.safeParse(raw);
		if (!parsed.success)
			return failAction(400, 'move', String(raw.id ?? ''), fieldErrors(parsed.error));
		try {
			followUps.move(parsed.data.id, parsed.data.status, actor.id);
		} catch (e) {
			if (e instanceof followUps.FollowUpError)
				return failAction(e.status, 'move', parsed.data.id, { form: e.message });
			throw e;
		}
		return doneAction('move', parsed.data.id, `Marked ${parsed.data.status}.`);
	},
	remind: async (event) => {
		requireRole(event, PLANNERS);
		const r = await runReminders();
		return doneAction(
			'remind',
			'all',
			`Reminders: ${r.sent} sent, ${r.skipped} already sent before.`
		);
	}
};
