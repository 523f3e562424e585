/**
 * The reminder job: due-soon and overdue mail to each follow-up's assignee. Idempotent: the
 * de-duplication key holds the follow-up and its due date, so however often it runs a follow-up
 * gets one due-soon and one overdue message per due date.
 */
import { Cron } from 'croner';
import * as followUps from '../db/follow-ups.ts';
import { followUpMail } from './messages.ts';
import { send } from './index.ts';

const DAY = 86_400_000;
const isoDay = (t: number) => new Date(t).toISOString().slice(0, 10);

export async function runReminders(now = Date.now()): Promise<{ sent: number; skipped: number }> {
	const today = isoDay(now);
	const soon = isoDay(now + 2 * DAY);
	let sent = 0;
	let skipped = 0;
	for (const f of followUps.due(soon)) {
		if (!f.assigneeEmail || !f.dueDate) continue;
		const kind = f.dueDate < today ? 'overdue' : 'due-soon';
		const r = await send({
			...followUpMail(kind, f),
			to: f.assigneeEmail,
			dedupeKey: `${kind}:${f.id}:${f.dueDate}`
		});
		if (r === 'sent') sent++;
		else skipped++;
	}
	return { sent, skipped };
}

let job: Cron | null = null;

/** Every 15 minutes, and once at start-up. */
export function startReminderJob(): void {
	if (job) return;
	job = new Cron('*/15 * * * *', { protect: true }, () => {
		void runReminders().catch((e) => console.error('[detune] reminders:', e));
	});
	void runReminders().catch((e) => console.error('[detune] reminders:', e));
}

export function stopReminderJob(): void {
	job?.stop();
	job = null;
}
