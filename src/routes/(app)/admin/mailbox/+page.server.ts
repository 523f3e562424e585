import { z } from 'zod';
import { desc } from 'drizzle-orm';
import type { Actions, PageServerLoad } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import { db } from '$lib/server/db';
import { mail } from '$lib/server/db/schema';
import { mailSettings, send } from '$lib/server/mail';
import { email } from '$lib/schemas/user';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';

/** The mail settings in use, the local catcher's mailbox (development, demo, tests) and what was sent. */
export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	return {
		settings: mailSettings(),
		me: user.email,
		messages: db
			.select({
				id: mail.id,
				kind: mail.kind,
				to: mail.toAddress,
				subject: mail.subject,
				text: mail.textBody,
				status: mail.status,
				error: mail.error,
				at: mail.createdAt
			})
			.from(mail)
			.orderBy(desc(mail.createdAt))
			.limit(300)
			.all()
	};
};

const testForm = z.object({ to: email }).strict();

export const actions: Actions = {
	test: async (event) => {
		requireRole(event, ['admin']);
		const parsed = testForm.safeParse(formToObject(await event.request.formData()));
		if (!parsed.success) return failAction(400, 'test', null, fieldErrors(parsed.error));
		const text =
			'This is a test message from Detune. If it arrived, follow-up assignments and reminders will reach people too.';
		const r = await send({
			kind: 'test',
			to: parsed.data.to,
			subject: 'Detune: test message',
			text,
			html: `<p>${text}</p>`,
			dedupeKey: `test:${crypto.randomUUID()}`
		});
		if (r === 'failed')
			return failAction(502, 'test', null, {
				to: 'The mail server refused the message or could not be reached; the error is in the Sent list below.'
			});
		return doneAction('test', null, `Test message sent to ${parsed.data.to}.`);
	}
};
