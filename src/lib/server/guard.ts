/**
 * The role guard, reading the one role × route table in $lib/access. hooks.server.ts runs it for
 * every request; each load, action and endpoint calls `authorize` again, so a page is protected
 * even if the hook is bypassed or reordered.
 */
import { error, json, redirect, type RequestEvent } from '@sveltejs/kit';
import { mayAccess, routeEntry } from '../access.ts';
import type { Role } from '../roles.ts';
import { escapeHtml } from './html.ts';

export type Decision = { ok: true } | { ok: false; status: 401 | 403; reason: string };

/** The decision for a route id and a user's role (null when signed out). */
export function decide(routeId: string | null, role: Role | null): Decision {
	const entry = routeEntry(routeId);
	if (!entry)
		return { ok: false, status: 403, reason: `Route ${routeId} has no entry in the access table.` };
	if (mayAccess(entry, role)) return { ok: true };
	if (role === null) return { ok: false, status: 401, reason: 'Sign in to continue.' };
	return { ok: false, status: 403, reason: `Your role (${role}) may not use this page.` };
}

export const isApi = (event: Pick<RequestEvent, 'url'>) => event.url.pathname.startsWith('/api/');

/** The response a refused request gets: JSON for the API, a sign-in redirect or an error page otherwise. */
export function refusal(event: RequestEvent, d: Extract<Decision, { ok: false }>): Response {
	if (isApi(event))
		return json(
			{ message: d.reason, code: d.status === 401 ? 'unauthenticated' : 'forbidden' },
			{ status: d.status }
		);
	if (d.status === 401) {
		const next = event.url.pathname + event.url.search;
		return new Response(null, {
			status: 303,
			headers: { location: `/login?next=${encodeURIComponent(next)}` }
		});
	}
	return new Response(forbiddenPage(d.reason), {
		status: 403,
		headers: { 'content-type': 'text/html; charset=utf-8' }
	});
}

function forbiddenPage(reason: string): string {
	return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Not allowed · Detune</title></head>
<body style="font-family:system-ui,sans-serif;font-size:18px;max-width:32rem;margin:4rem auto;padding:0 1rem">
<h1>Not allowed</h1><p>${escapeHtml(reason)}</p><p><a href="/" style="display:inline-block;padding:12px 0;font-weight:700">Back to Detune</a></p></body></html>`;
}

/**
 * Throws unless the signed-in user may use this route; returns the user. For loads, actions and
 * endpoints.
 */
export function authorize(event: RequestEvent) {
	const user = event.locals.user;
	const d = decide(event.route.id, user?.role ?? null);
	if (d.ok) return user;
	if (d.status === 401) {
		if (isApi(event)) error(401, { message: d.reason, code: 'unauthenticated' });
		redirect(303, `/login?next=${encodeURIComponent(event.url.pathname + event.url.search)}`);
	}
	error(403, { message: d.reason, code: 'forbidden' });
}

/** Like authorize, for routes that need a signed-in user: never returns null. */
export function requireUser(event: RequestEvent) {
	const user = authorize(event);
	if (!user) error(401, { message: 'Sign in to continue.', code: 'unauthenticated' });
	return user;
}

/** Throws 403 unless the signed-in user has one of `roles` (for actions finer than the route). */
export function requireRole(event: RequestEvent, roles: readonly Role[]) {
	const user = requireUser(event);
	if (!roles.includes(user.role))
		error(403, { message: `Your role (${user.role}) may not do this.`, code: 'forbidden' });
	return user;
}
