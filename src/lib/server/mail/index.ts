/**
 * E-mail through nodemailer over SMTP. Every message is recorded in the mail table first, under a
 * de-duplication key, so a job that runs twice never sends the same mail twice. Without an
 * SMTP_HOST (development, the demo, the tests) a local catcher (smtp-server) receives the mail and
 * stores it in the same table, readable at Admin → Mail.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { eq } from 'drizzle-orm';
import { db } from '../db/index.ts';
import { mail } from '../db/schema.ts';
import { setting } from '../config.ts';

export interface Outgoing {
	kind: 'assignment' | 'due-soon' | 'overdue' | 'retested' | 'test';
	to: string;
	subject: string;
	text: string;
	html: string;
	/** never send two messages with the same key */
	dedupeKey: string;
}

const localPort = () => Number(setting('SMTP_PORT') ?? 2525);
const usesCatcher = () => !setting('SMTP_HOST') && setting('MAIL_CATCHER') !== 'false';

let transporter: Transporter | null = null;
function transport(): Transporter {
	transporter ??= nodemailer.createTransport(
		setting('SMTP_HOST')
			? {
					host: setting('SMTP_HOST'),
					port: Number(setting('SMTP_PORT') ?? 587),
					secure: setting('SMTP_SECURE') === 'true',
					auth: setting('SMTP_USER')
						? { user: setting('SMTP_USER') as string, pass: setting('SMTP_PASSWORD') ?? '' }
						: undefined
				}
			: {
					host: '127.0.0.1',
					port: localPort(),
					secure: false,
					ignoreTLS: true,
					auth: { user: CATCHER_USER, pass: catcherPassword }
				}
	);
	return transporter;
}

/** What the mail settings are, for Admin → Mail (never the password). */
export function mailSettings() {
	const host = setting('SMTP_HOST');
	return {
		transport: host ? ('relay' as const) : usesCatcher() ? ('catcher' as const) : ('none' as const),
		host: host ?? '127.0.0.1',
		port: host ? Number(setting('SMTP_PORT') ?? 587) : localPort(),
		secure: setting('SMTP_SECURE') === 'true',
		user: setting('SMTP_USER') ?? null,
		from: fromAddress(),
		reminders: setting('MAIL_JOBS') !== 'false'
	};
}

export const fromAddress = () => setting('MAIL_FROM') ?? 'Detune <detune@example.com>';

/** Records, then sends. Returns 'duplicate' when the key was used before. */
export async function send(m: Outgoing): Promise<'sent' | 'duplicate' | 'failed'> {
	const id = crypto.randomUUID();
	const inserted = db
		.insert(mail)
		.values({
			id,
			dedupeKey: m.dedupeKey,
			kind: m.kind,
			toAddress: m.to,
			subject: m.subject,
			textBody: m.text,
			htmlBody: m.html,
			status: 'queued',
			createdAt: Date.now()
		})
		.onConflictDoNothing()
		.run();
	if (inserted.changes === 0) return 'duplicate';
	try {
		await transport().sendMail({
			from: fromAddress(),
			to: m.to,
			subject: m.subject,
			text: m.text,
			html: m.html,
			headers: { 'X-Detune-Kind': m.kind }
		});
		db.update(mail).set({ status: 'sent' }).where(eq(mail.id, id)).run();
		return 'sent';
	} catch (e) {
		db.update(mail)
			.set({ status: 'failed', error: (e as Error).message })
			.where(eq(mail.id, id))
			.run();
		console.error('[detune] mail failed:', (e as Error).message);
		return 'failed';
	}
}

/**
 * The subject and the plain text of a raw message, for the mailbox page: mailparser decodes the
 * MIME structure, transfer encodings (quoted-printable, base64) and encoded-word headers.
 */
export async function readMessage(
	raw: Buffer | string
): Promise<{ subject: string; text: string }> {
	const m = await simpleParser(raw, {
		skipHtmlToText: false,
		skipImageLinks: true,
		skipTextLinks: true
	});
	return { subject: m.subject ?? '', text: (m.text ?? '').trim() };
}

let catcher: SMTPServer | null = null;
/**
 * The catcher takes mail only from this server: a credential made afresh at every start, known
 * only to this process. Any other local program is refused, so nothing shows in Admin → Mail that
 * Detune did not send.
 */
const CATCHER_USER = 'detune';
const catcherPassword = Buffer.from(crypto.getRandomValues(new Uint8Array(24))).toString(
	'base64url'
);

/** Starts the local catcher when no SMTP relay is configured. */
export function startCatcher(): Promise<void> {
	if (!usesCatcher() || catcher) return Promise.resolve();
	catcher = new SMTPServer({
		authOptional: false,
		// loopback only, so no TLS; the credential is what keeps strangers out
		allowInsecureAuth: true,
		authMethods: ['PLAIN', 'LOGIN'],
		disabledCommands: ['STARTTLS'],
		onAuth(auth, _session, callback) {
			const ok =
				auth.username === CATCHER_USER &&
				typeof auth.password === 'string' &&
				auth.password === catcherPassword;
			if (!ok) return callback(new Error('Authentication refused'));
			callback(null, { user: CATCHER_USER });
		},
		logger: false,
		size: 5 * 1024 * 1024,
		onData(stream, session, callback) {
			const chunks: Buffer[] = [];
			stream.on('data', (c: Buffer) => chunks.push(c));
			stream.on('end', async () => {
				const bytes = Buffer.concat(chunks);
				const raw = bytes.toString('utf8');
				const { subject, text } = await readMessage(bytes).catch((e: Error) => ({
					subject: '',
					text: `(the message could not be read: ${e.message})`
				}));
				const to = session.envelope.rcptTo.map((r) => r.address).join(', ');
				db.insert(mail)
					.values({
						id: crypto.randomUUID(),
						kind: 'received',
						toAddress: to,
						subject,
						textBody: text,
						raw,
						status: 'received',
						createdAt: Date.now()
					})
					.run();
				callback();
			});
		}
	});
	return new Promise((resolve) => {
		// a port already taken must not stop the app from starting: mail then fails and says so
		catcher!.on('error', (e) => {
			console.error(`[detune] mail catcher on port ${localPort()}: ${e.message}`);
			resolve();
		});
		catcher!.listen(localPort(), '127.0.0.1', () => {
			console.log(`[detune] local mail catcher on 127.0.0.1:${localPort()} (Admin → Mail)`);
			resolve();
		});
	});
}

export function stopCatcher(): Promise<void> {
	const c = catcher;
	catcher = null;
	transporter?.close();
	transporter = null;
	return c ? new Promise((r) => c.close(() => r())) : Promise.resolve();
}
