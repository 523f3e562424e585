import type { PageServerLoad } from './$types';
import { desc } from 'drizzle-orm';
import { requireUser } from '$lib/server/guard';
import { db } from '$lib/server/db';
import { mail } from '$lib/server/db/schema';

/** The local catcher's mailbox (development, demo, tests) and what was sent. */
export const load: PageServerLoad = (event) => {
	requireUser(event);
	return { messages: db.select({ id: mail.id, kind: mail.kind, to: mail.toAddress, subject: mail.subject, text: mail.textBody, status: mail.status, error: mail.error, at: mail.createdAt }).from(mail).orderBy(desc(mail.createdAt)).limit(300).all() };
};
