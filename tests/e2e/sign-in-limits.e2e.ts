/**
 * Sign-in limits that cannot be turned against a plant: behind a reverse proxy each tablet is
 * counted by the address the proxy reports (ADDRESS_HEADER, XFF_DEPTH), and wrong passwords make
 * an account wait a little, never lock its holder out; an admin lifts the wait at once.
 */
import { expect, test } from './fixtures.ts';
import { startBuiltServer, type BuiltServer } from '../support/built-server.ts';
import { DEMO_PASSWORDS } from '../../src/lib/server/db/demo-data.ts';

let server: BuiltServer;
test.beforeAll(async () => {
	server = await startBuiltServer(4189, {
		env: { ADDRESS_HEADER: 'X-Forwarded-For', XFF_DEPTH: '1' }
	});
});
test.afterAll(() => server.stop());

/** A sign-in as it arrives through the proxy, from the tablet at `address`. */
function signInFrom(address: string, email: string, password: string) {
	return fetch(`${server.origin}/login`, {
		method: 'POST',
		headers: {
			'content-type': 'application/x-www-form-urlencoded',
			origin: server.origin,
			accept: 'text/html',
			'x-forwarded-for': address
		},
		body: new URLSearchParams({ email, password }),
		redirect: 'manual'
	});
}

test('behind a proxy, 40 failures from one tablet do not lock out the plant', async () => {
	for (let i = 0; i < 40; i++) await signInFrom('10.20.7.7', `nobody${i}@example.com`, 'guess');
	const noisy = await signInFrom('10.20.7.7', 'planner@example.com', DEMO_PASSWORDS.planner);
	expect(noisy.status, 'that tablet waits').toBe(429);
	const other = await signInFrom('10.20.7.8', 'planner@example.com', DEMO_PASSWORDS.planner);
	expect(other.status, 'every other tablet signs in').toBe(303);
});

test('five wrong passwords make the account wait a minute, not lock it; an admin unlocks it in Admin → Users', async ({
	page
}) => {
	for (let i = 0; i < 5; i++)
		expect((await signInFrom(`10.21.0.${i}`, 'tech@example.com', 'wrong')).status).toBe(400);
	const held = await signInFrom('10.21.1.1', 'tech@example.com', DEMO_PASSWORDS.technician);
	expect(held.status).toBe(429);
	expect(await held.text()).toContain('Wait 1 minute');

	// the admin's desk, through the same proxy
	await page.setExtraHTTPHeaders({ 'x-forwarded-for': '10.21.9.9' });
	await page.goto(`${server.origin}/login`);
	await page.getByLabel('E-mail').fill('admin@example.com');
	await page.getByLabel('Password').fill(DEMO_PASSWORDS.admin);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page.getByTestId('user-name')).toBeVisible();
	await page.goto(`${server.origin}/admin/users`);
	const row = page.getByTestId('user-row').filter({ hasText: 'tech@example.com' });
	await expect(row.getByTestId('sign-in-pause')).toContainText('5 failed sign-ins');
	await row.getByRole('button', { name: 'Unlock sign-in' }).click();
	await expect(row.getByRole('status')).toContainText('Sign-in unlocked');
	const after = await signInFrom('10.21.1.1', 'tech@example.com', DEMO_PASSWORDS.technician);
	expect(after.status).toBe(303);
});
