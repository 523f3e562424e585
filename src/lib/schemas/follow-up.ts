/** Follow-up forms: created from a flagged check or an asset, then assigned, scheduled and closed. */
import { z } from 'zod';
import { queryToObject } from './form.ts';

export const FOLLOW_UP_STATUS_LIST = ['open', 'scheduled', 'done', 'retested'] as const;
export const PRIORITY_LIST = ['low', 'normal', 'high', 'urgent'] as const;

/** A real calendar day (YYYY-MM-DD); `label` starts the message. */
const dayOf = (label: string) =>
	z
		.string()
		.trim()
		.regex(/^\d{4}-\d{2}-\d{2}$/, `${label}: a date (YYYY-MM-DD).`)
		.refine((d) => {
			// Date.parse rolls 2026-02-30 over into March: a real day reads back as itself
			const t = Date.parse(`${d}T00:00:00Z`);
			return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === d;
		}, `${label}: a real calendar day.`);
const day = dayOf('Due date');

/** A ticked checkbox ("on"), or yes. */
const ticked = z
	.preprocess((v) => v === 'on' || v === 'yes' || v === true, z.boolean())
	.default(false);

/**
 * A due date before today is refused unless the person says the record is back-dated (work that
 * was already due). Today is the server's UTC date less a day, so no time zone turns today into
 * the past.
 */
export function pastDueProblem(
	due: string | null,
	today: string,
	backdated: boolean
): string | null {
	if (due === null || backdated) return null;
	const grace = new Date(Date.parse(`${today}T00:00:00Z`) - 86_400_000).toISOString().slice(0, 10);
	return due < grace
		? `Due date: ${due} has passed. Pick today or later, or tick “Back-dated record” for work that was already due.`
		: null;
}

/** What a planner sets on a follow-up, created or edited: the same rules both ways. */
const planFields = {
	assigneeId: z.preprocess((v) => (v === '' ? null : v), z.string().max(64).nullable()),
	dueDate: z.preprocess((v) => (v === '' ? null : v), day.nullable()),
	priority: z.enum(PRIORITY_LIST, { error: `Priority: ${PRIORITY_LIST.join(', ')}.` }),
	notes: z.string().max(4000, 'Notes: at most 4000 characters.').default(''),
	backdated: ticked
};

export const followUpCreate = z
	.object({
		assetId: z.string().min(1, 'Choose the asset.').max(64),
		checkId: z.preprocess((v) => (v === '' ? null : v), z.string().max(64).nullable()),
		title: z
			.string()
			.trim()
			.min(3, 'Title: say what is to be done (at least 3 characters).')
			.max(200, 'Title: at most 200 characters.'),
		...planFields
	})
	.strict();

export const followUpUpdate = z
	.object({
		id: z.string().min(1).max(64),
		...planFields
	})
	.strict();

export const followUpMove = z
	.object({
		id: z.string().min(1).max(64),
		status: z.enum(['open', 'scheduled', 'done'], {
			error: 'Status: open, scheduled or done (retested comes from a clear check).'
		})
	})
	.strict();

/** The week calendar moves one follow-up to another day (drag, or pick and place). */
export const followUpReschedule = z
	.object({ id: z.string().min(1).max(64), dueDate: day })
	.strict();

/**
 * The follow-ups list's address: a status tab, one assignee (planners), overdue only, a follow-up
 * to open (`id`, from the e-mail's link), the prefill of the create form (`new`, `check`), and the
 * view: the list, or the week calendar of the week holding `week`.
 */
export const followUpListQuery = z
	.object({
		status: z.enum(FOLLOW_UP_STATUS_LIST, {
			error: `status: ${FOLLOW_UP_STATUS_LIST.join(', ')}.`
		}),
		assignee: z.uuid({ error: 'assignee: a user id.' }),
		overdue: z.literal('yes', { error: 'overdue: yes, or leave it out.' }),
		id: z.string().max(64),
		new: z.string().max(64),
		check: z.string().max(64),
		/** the follow-up just created, shown highlighted with its confirmation */
		created: z.string().max(64),
		mailed: z.literal('yes', { error: 'mailed: yes, or leave it out.' }),
		view: z.enum(['list', 'week'], { error: 'view: list or week.' }),
		week: dayOf('week')
	})
	.partial();

export type FollowUpListQuery = z.infer<typeof followUpListQuery>;

/** The list's address parsed; empty parameters count as absent. */
export const parseListQuery = (params: URLSearchParams) =>
	followUpListQuery.safeParse(queryToObject(params));

export type FollowUpCreate = z.infer<typeof followUpCreate>;
export type FollowUpUpdate = z.infer<typeof followUpUpdate>;

/** The columns of the follow-ups export (CSV and Excel), in order. */
export const FOLLOW_UP_COLUMNS = [
	'tag',
	'asset',
	'site',
	'title',
	'status',
	'priority',
	'due_date',
	'assignee',
	'created',
	'notes'
];
