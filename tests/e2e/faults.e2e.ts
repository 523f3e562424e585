/**
 * The server dies mid-batch (SIGKILL while a push transaction is open) and is started again on the
 * same database: the file is intact, no part of the batch is stored, and the tablet's outbox sends
 * it again — every check arrives exactly once.
 */
import { expect, test } from './fixtures.ts';
import type { BrowserContext, Page } from '@playwright/test';
import { cleanDir, startBuiltServer, withDatabase } from '../support/built-server.ts';
import { openFieldOnline, outboxCount, saveChecks, syncAll } from './floor.ts';

const PORT = 4181;
const DIR = '.e2e/killed';

test.afterAll(() => cleanDir(DIR));

/** Opened read-write: after a SIGKILL the first opener rolls back the write-ahead log. */
function inspect(file: string, ids: string[]) {
	return withDatabase(
		file,
		(db) => {
			const integrity = db.pragma('integrity_check', { simple: true });
			const stored = (
				db
					.prepare('select count(*) as n from checks where id in (select value from json_each(?))')
					.get(JSON.stringify(ids)) as { n: number }
			).n;
			const modes = (
				db
					.prepare(
						'select count(*) as n from modes where check_id in (select value from json_each(?))'
					)
					.get(JSON.stringify(ids)) as { n: number }
			).n;
			const total = (db.prepare('select count(*) as n from checks').get() as { n: number }).n;
			return { integrity, stored, modes, total };
		},
		{}
	);
}

/** Floor check opened online once, then three checks saved with the network off, in the outbox. */
async function queueThreeOffline(context: BrowserContext, page: Page) {
	await openFieldOnline(page);
	await context.setOffline(true);
	await saveChecks(page, ['KRW-HLP-202', 'KRW-HLP-203', 'KRW-BWP-301']);
	await expect.poll(() => outboxCount(page)).toBe(3);
}

test('SIGKILL mid-batch: the database is intact, no half batch is stored, the tablet retries and nothing is lost or doubled', async ({
	browser
}) => {
	test.setTimeout(150_000);
	cleanDir(DIR);
	let server = await startBuiltServer(PORT, { dir: DIR, fault: 'hold@2' });
	const context = await browser.newContext({ baseURL: server.origin });
	const page = await context.newPage();
	try {
		await queueThreeOffline(context, page);
		const before = inspect(server.dbFile, []);

		const ids: string[] = [];
		// the server's armed fault writes item 1, then stops inside the open transaction at item 2
		await page.route('**/api/sync/push', async (route) => {
			ids.push(
				...(route.request().postDataJSON() as { items: { id: string }[] }).items.map((i) => i.id)
			);
			return route.continue();
		});
		await context.setOffline(false);
		await server.waitForLine(/batch held open at item 2/);
		await server.kill('SIGKILL');

		const afterKill = inspect(server.dbFile, ids);
		expect(afterKill.integrity).toBe('ok');
		expect(afterKill.stored, 'no item of the killed batch is stored').toBe(0);
		expect(afterKill.modes).toBe(0);
		expect(afterKill.total).toBe(before.total);
		await expect(page.getByTestId('sync-state')).toHaveText('Sync failed');
		expect(await outboxCount(page)).toBe(3);

		server = await startBuiltServer(PORT, { dir: DIR });
		await syncAll(page);
		const unique = [...new Set(ids)];
		expect(unique).toHaveLength(3);
		const afterRetry = inspect(server.dbFile, unique);
		expect(afterRetry.integrity).toBe('ok');
		expect(afterRetry.stored).toBe(3);
		expect(afterRetry.modes).toBe(3);
		expect(afterRetry.total).toBe(before.total + 3);
	} finally {
		await context.close();
		await server.kill('SIGTERM');
	}
});

test('a server fault on the second item: the first is acknowledged and gone, the others stay and go through on retry', async ({
	browser
}) => {
	const dir = `${DIR}-item`;
	cleanDir(dir);
	const server = await startBuiltServer(PORT + 1, { dir, fault: 'fail@2' });
	const context = await browser.newContext({ baseURL: server.origin });
	const page = await context.newPage();
	try {
		await queueThreeOffline(context, page);
		// reconnecting pushes at once; the armed fault fails the batch at its second item
		await context.setOffline(false);
		await expect.poll(() => outboxCount(page)).toBe(2);
		await expect(page.getByTestId('sync-state')).toHaveText('Sync failed');
		await syncAll(page);
		const stored = inspect(server.dbFile, []);
		expect(stored.integrity).toBe('ok');
	} finally {
		await context.close();
		await server.stop();
		cleanDir(dir);
	}
});
