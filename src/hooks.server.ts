import type { Handle, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { setting } from '$lib/server/config';
import { db, sqlite } from '$lib/server/db';
import { holdDatabase } from '$lib/server/db/server-lock';
import { openSetup } from '$lib/server/setup';
import { dataDir } from '$lib/server/recordings';
import { mkdirSync } from 'node:fs';
import { runMigrations } from '$lib/server/db/client';
import { startPlannerUpkeep, stopPlannerUpkeep } from '$lib/server/db/upkeep';
import { isEmpty, seed } from '$lib/server/db/seed';
import { SESSION_COOKIE, validateSession } from '$lib/server/auth';
import { decide, refusal } from '$lib/server/guard';
import { startCatcher, stopCatcher } from '$lib/server/mail';
import { startReminderJob, stopReminderJob } from '$lib/server/mail/reminders';

/** Runs before the server takes its first request: migrate, then seed an empty database. */
export const init: ServerInit = async () => {
	runMigrations(db);
	holdDatabase(sqlite.name);
	mkdirSync(dataDir(), { recursive: true, mode: 0o700 });
	// the demo (with its published passwords) only when asked for: `npm start` asks, `node build` not
	if (setting('SEED_DEMO') === 'true' && isEmpty(db)) {
		const r = await seed(db);
		console.log(
			`[detune] empty database: demo data added (${r.sites} sites, ${r.assets} assets, ${r.users} users)`
		);
	}
	startPlannerUpkeep(sqlite);
	const token = openSetup();
	if (token)
		console.log(
			`[detune] no admin account yet: create the first one at ${setting('ORIGIN') ?? ''}/setup?token=${token} (this link works once, until the server restarts)`
		);
	await startCatcher();
	if (setting('MAIL_JOBS') !== 'false') startReminderJob();
	// adapter-node's graceful shutdown (SIGTERM/SIGINT): let the process end
	process.once('sveltekit:shutdown', () => {
		stopReminderJob();
		stopPlannerUpkeep();
		void stopCatcher();
	});
};

const session: Handle = async ({ event, resolve }) => {
	const id = event.cookies.get(SESSION_COOKIE);
	event.locals.user = null;
	event.locals.session = null;
	if (id) {
		const { user, session, cookie } = await validateSession(id);
		event.locals.user = user;
		event.locals.session = session;
		if (cookie) event.cookies.set(cookie.name, cookie.value, { path: '/', ...cookie.attributes });
	}
	return resolve(event);
};

const guard: Handle = async ({ event, resolve }) => {
	// unknown paths have no route id: let SvelteKit answer 404
	if (event.route.id === null) return resolve(event);
	const d = decide(event.route.id, event.locals.user?.role ?? null);
	if (!d.ok) return refusal(event, d);
	return resolve(event);
};

const headers: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const h = response.headers;
	h.set('X-Content-Type-Options', 'nosniff');
	h.set('Referrer-Policy', 'strict-origin-when-cross-origin');
	h.set('X-Frame-Options', 'DENY');
	// the microphone (an audio input) for tap capture on this origin only; nothing else
	h.set('Permissions-Policy', 'camera=(), microphone=(self), geolocation=(), payment=()');
	h.set('Cross-Origin-Opener-Policy', 'same-origin');
	if (event.locals.user && !h.has('Cache-Control')) h.set('Cache-Control', 'private, no-store');
	return response;
};

// headers first, so that refusals from the guard carry them too
export const handle = sequence(headers, session, guard);
