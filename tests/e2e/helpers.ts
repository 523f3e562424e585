import { expect, type APIRequestContext, type Page } from '@playwright/test';
import { DEMO_PASSWORDS, DEMO_USERS } from '../../src/lib/server/db/demo-data.ts';
import type { Role } from '../../src/lib/roles.ts';

export const ORIGIN = 'http://127.0.0.1:4173';

export function demoUser(role: Role) {
	const u = DEMO_USERS.find((x) => x.role === role)!;
	return { ...u, password: DEMO_PASSWORDS[role] };
}

/** Signs in through the real form, as a person would. */
export async function signIn(page: Page, role: Role) {
	const u = demoUser(role);
	await page.goto('/login');
	await page.getByLabel('E-mail').fill(u.email);
	await page.getByLabel('Password').fill(u.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByTestId('user-name')).toHaveText(u.name);
	return u;
}

/** Signs an API request context in by posting the sign-in form (with the Origin the CSRF check wants). */
export async function signInApi(request: APIRequestContext, role: Role) {
	const u = demoUser(role);
	const res = await request.post('/login', {
		form: { email: u.email, password: u.password },
		headers: { origin: ORIGIN, accept: 'text/html' },
		maxRedirects: 0
	});
	expect(res.status(), `sign-in of ${u.email}`).toBe(303);
	return u;
}
