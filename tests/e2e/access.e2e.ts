import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { request as playwrightRequest, type APIRequestContext } from '@playwright/test';
import { expect, test } from './fixtures.ts';
import { ROUTE_ACCESS, mayAccess, type RouteEntry } from '../../src/lib/access.ts';
import { ROLES, type Role } from '../../src/lib/roles.ts';
import { ORIGIN, signInApi } from './helpers.ts';

const ROUTES_DIR = join(process.cwd(), 'src/routes');

/** Every route id under src/routes: a folder holding a +page.svelte or a +server.ts. */
function routeIds(dir = ROUTES_DIR): string[] {
	const out: string[] = [];
	const files = readdirSync(dir);
	if (files.some((f) => f === '+page.svelte' || f === '+server.ts')) {
		const rel = relative(ROUTES_DIR, dir).split('\\').join('/');
		out.push(rel === '' ? '/' : `/${rel}`);
	}
	for (const f of files)
		if (statSync(join(dir, f)).isDirectory()) out.push(...routeIds(join(dir, f)));
	return out;
}

/** A concrete URL for a route id: groups dropped, parameters from the table's sample. */
function pathOf(id: string, entry: RouteEntry): string {
	if (entry.sample) return entry.sample;
	const p = id.replace(/\/\([^)]+\)/g, '');
	expect(p, `route ${id} has parameters: give it a sample path in the table`).not.toMatch(/\[/);
	return p === '' ? '/' : p;
}

async function probe(ctx: APIRequestContext, id: string, entry: RouteEntry) {
	const url = pathOf(id, entry);
	const options = { maxRedirects: 0, headers: { origin: ORIGIN, accept: 'text/html' } };
	if (entry.method !== 'POST') return ctx.get(url, options);
	return id.startsWith('/api/')
		? ctx.post(url, { ...options, data: {} })
		: ctx.post(url, { ...options, form: {} });
}

test('every route under src/routes has an entry in the role × route table, and no entry is stale', () => {
	expect(routeIds().sort()).toEqual(Object.keys(ROUTE_ACCESS).sort());
});

for (const who of [null, ...ROLES] as (Role | null)[]) {
	test(`each route answers ${who ?? 'an anonymous visitor'} as the table says`, async () => {
		const ctx = await playwrightRequest.newContext({ baseURL: ORIGIN });
		if (who) await signInApi(ctx, who);
		// probe sign-out last: it ends the session
		const entries = Object.entries(ROUTE_ACCESS).sort(
			([a], [b]) => Number(a === '/logout') - Number(b === '/logout')
		);
		for (const [id, entry] of entries) {
			const res = await probe(ctx, id, entry);
			const status = res.status();
			const location = res.headers()['location'] ?? '';
			const what = `${entry.method ?? 'GET'} ${id} as ${who ?? 'anonymous'} → ${status} ${location}`;
			if (mayAccess(entry, who)) {
				// allowed: anything but a refusal (an empty probe may still be a 4xx for bad input)
				expect([401, 403].includes(status), what).toBe(false);
				expect(status < 500, what).toBe(true);
				if (status >= 300 && status < 400 && entry.method !== 'POST')
					expect(location.startsWith('/login'), what).toBe(false);
			} else if (who === null) {
				if (id.startsWith('/api/')) expect(status, what).toBe(401);
				else {
					expect(status, what).toBe(303);
					expect(location, what).toMatch(/^\/login\?next=/);
				}
			} else {
				expect(status, what).toBe(403);
			}
		}
		await ctx.dispose();
	});
}
