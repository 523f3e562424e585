/**
 * Bad input, generated with fast-check, at every JSON route and form action of a server of its
 * own: wrong types, huge strings, negative, NaN and infinite numbers, unknown fields, ids that do
 * not exist, deep nesting. Every answer must be a 4xx that tells the person what is wrong (a JSON
 * `message`, or on a page a field marked invalid or an alert) — never a 500 — and no table may
 * gain, lose or change a row. Oversized uploads must be refused before their body is read.
 */
import { expect, test } from './fixtures.ts';
import fc from 'fast-check';
import { connect } from 'node:net';
import {
	cleanDir,
	signInCookie,
	startBuiltServer,
	withDatabase,
	type BuiltServer
} from '../support/built-server.ts';
import { demoUser } from './helpers.ts';
import { checkItem } from '../support/check-item.ts';
import type { Role } from '../../src/lib/roles.ts';

const PORT = 4182;
const DIR = '.e2e/bad-input';
/** runs per property; FUZZ_RUNS=500 for a long hunt */
const RUNS = Number(process.env.FUZZ_RUNS ?? 25);
const HUGE = 'x'.repeat(100_000);

let server: BuiltServer;
const cookies = {} as Record<Role, string>;

test.beforeAll(async () => {
	cleanDir(DIR);
	server = await startBuiltServer(PORT, { dir: DIR });
	for (const role of ['technician', 'supervisor', 'planner', 'admin'] as Role[]) {
		const u = demoUser(role);
		cookies[role] = await signInCookie(server.origin, u.email, u.password);
	}
});

test.afterAll(async () => {
	await server?.kill('SIGTERM');
	cleanDir(DIR);
});

/**
 * Every table's rows, hashed, except the sessions that signing in itself makes, SQLite's own
 * statistics, and the board's search index (asset_search and its shadow tables: derived from
 * asset_status, which is compared).
 */
function snapshot(): Record<string, string> {
	return withDatabase(server.dbFile, (db) => {
		const tables = (
			db
				.prepare(
					"select name from sqlite_master where type = 'table' and name not in ('sessions', 'sqlite_sequence', 'sqlite_stat1', 'sqlite_stat4') and name not like 'asset_search%'"
				)
				.all() as { name: string }[]
		).map((t) => t.name);
		return Object.fromEntries(
			tables.map((t) => [
				t,
				JSON.stringify(db.prepare(`select * from "${t}" order by rowid`).raw().all())
			])
		);
	});
}

const one = <T>(sql: string): T => withDatabase(server.dbFile, (db) => db.prepare(sql).get() as T);

/** What kind of value a field takes, and values that are always wrong for it. */
const BAD: Record<string, string[]> = {
	number: ['NaN', 'Infinity', '-1', '-1e309', '1e309', 'abc', '', '0x', HUGE],
	optNumber: ['NaN', 'Infinity', '-1', 'abc', '1e309', HUGE],
	int: ['1.5', '-1', '0', 'NaN', 'abc', '', HUGE],
	/** a count where 0 is a real answer (a drive with no skip bands) */
	count: ['1.5', '-1', 'NaN', 'abc', '', HUGE],
	optInt: ['1.5', '1', '65', 'NaN', 'abc', HUGE],
	enum: ['', 'bogus', '<script>alert(1)</script>', HUGE],
	text: ['', ' ', HUGE],
	longText: [HUGE],
	id: ['', 'no-such-thing', '00000000-0000-4000-a000-000000000000', HUGE],
	optId: ['no-such-thing', '00000000-0000-4000-a000-000000000000', HUGE],
	date: ['2026-13-45', 'tomorrow', '2026-02-30', HUGE],
	email: ['', 'no-at-sign', `${HUGE}@example.com`],
	password: ['', 'short', HUGE],
	list: ['a, b', '-1', 'NaN', HUGE],
	code: ['', 'x', '-AB', 'A B', 'ÄÖ', HUGE]
};

interface FormCase {
	name: string;
	/** null: sent without a session */
	role: Role | null;
	path: string;
	action?: string;
	base: Record<string, string | string[]>;
	fields: Record<string, keyof typeof BAD>;
}

/** A form with at least one field made wrong, and perhaps fields nobody asked for. */
function badForm(c: FormCase) {
	const names = Object.keys(c.fields);
	return fc
		.record({
			broken: fc.uniqueArray(fc.constantFrom(...names), {
				minLength: 1,
				maxLength: Math.min(3, names.length)
			}),
			pick: fc.array(fc.nat(), { minLength: 3, maxLength: 3 }),
			extra: fc.dictionary(
				fc
					.string({ minLength: 1, maxLength: 12 })
					.filter((k) => !(k in c.base) && !(k in c.fields)),
				fc.string({ maxLength: 40 }),
				{ maxKeys: 2 }
			)
		})
		.map(({ broken, pick, extra }) => {
			const form = new URLSearchParams();
			const values: Record<string, string | string[]> = { ...c.base };
			broken.forEach((f, i) => {
				const bad = BAD[c.fields[f]];
				values[f] = bad[pick[i] % bad.length];
			});
			for (const [k, v] of Object.entries(values))
				for (const x of Array.isArray(v) ? v : [v]) form.append(k, x);
			for (const [k, v] of Object.entries(extra)) form.append(k, v);
			return {
				form,
				broken: broken.map((f) => `${f}=${String(values[f]).slice(0, 20)}`).join(' ')
			};
		});
}

async function postForm(c: FormCase, form: URLSearchParams) {
	const url = `${server.origin}${c.path}${c.action ? `?/${c.action}` : ''}`;
	const res = await fetch(url, {
		method: 'POST',
		headers: {
			'content-type': 'application/x-www-form-urlencoded',
			origin: server.origin,
			accept: 'text/html',
			...(c.role ? { cookie: cookies[c.role] } : {})
		},
		body: form,
		redirect: 'manual'
	});
	return { status: res.status, body: await res.text() };
}

/** A page that answers bad input shows it: a field marked invalid, or an alert. */
const showsMessage = (html: string) => /aria-invalid="true"|role="alert"/.test(html);

test.describe('bad input is refused with a message and changes nothing', () => {
	let ids: {
		asset: string;
		check: string;
		source: string;
		followUp: string;
		user: string;
		ruleSet: string;
		site: string;
		area: string;
	};
	test.beforeAll(async () => {
		// one open follow-up to aim at (the demo has none open)
		const asset0 = one<{ id: string }>("select id from assets where tag = 'KRW-RWP-101'");
		const made = await fetch(`${server.origin}/follow-ups?/create`, {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				origin: server.origin,
				accept: 'text/html',
				cookie: cookies.planner
			},
			body: new URLSearchParams({
				assetId: asset0.id,
				checkId: '',
				title: 'Bump-test the base again',
				assigneeId: '',
				dueDate: '',
				priority: 'normal',
				notes: ''
			})
		});
		expect(made.status).toBe(200);
		const asset = one<{ id: string; site_id: string }>(
			"select id, site_id from assets where tag = 'KRW-RWP-101'"
		);
		ids = {
			asset: asset.id,
			site: asset.site_id,
			check: one<{ id: string }>(
				`select id from checks where asset_id = '${asset.id}' order by checked_at desc`
			).id,
			source: one<{ id: string }>(
				`select id from excitation_sources where asset_id = '${asset.id}' and kind = 'vane'`
			).id,
			followUp: one<{ id: string }>(
				"select id from follow_ups where status = 'open' order by created_at"
			).id,
			user: one<{ id: string }>("select id from users where email = 'tech2@example.com'").id,
			ruleSet: one<{ id: string }>('select id from rule_sets order by name').id,
			area: one<{ id: string }>('select id from areas order by name').id
		};
	});

	const cases = (): FormCase[] => [
		{
			name: 'sign in',
			role: null,
			path: '/login',
			base: { email: 'tech@example.com', password: 'x' },
			fields: { email: 'text', password: 'password' }
		},
		{
			name: 'asset: save',
			role: 'supervisor',
			path: `/assets/${ids.asset}`,
			action: 'updateAsset',
			base: {
				name: 'Raw water pump 1',
				machineKind: 'pump',
				driveType: 'vfd',
				minRpm: '600',
				maxRpm: '1800',
				nominalRpm: '',
				motorPoles: '',
				driveRatio: '1',
				skipBands: '3',
				ruleSetId: '',
				notes: ''
			},
			fields: {
				name: 'text',
				machineKind: 'enum',
				driveType: 'enum',
				minRpm: 'number',
				maxRpm: 'number',
				nominalRpm: 'optNumber',
				motorPoles: 'optInt',
				driveRatio: 'number',
				skipBands: 'count',
				ruleSetId: 'optId',
				notes: 'longText'
			}
		},
		{
			name: 'asset: source',
			role: 'supervisor',
			path: `/assets/${ids.asset}`,
			action: 'updateSource',
			base: {
				sourceId: ids.source,
				label: 'Impeller vanes',
				'p.count': '5',
				'p.harmonics': '',
				'p.speedRatio': ''
			},
			fields: {
				sourceId: 'id',
				'p.count': 'int',
				'p.harmonics': 'list',
				'p.speedRatio': 'optNumber',
				label: 'longText'
			}
		},
		{
			name: 'asset: add source',
			role: 'supervisor',
			path: `/assets/${ids.asset}`,
			action: 'addSource',
			base: { kind: 'fixed', label: 'Cooling fan', 'p.frequencyHz': '50' },
			fields: { kind: 'enum', 'p.frequencyHz': 'number', label: 'longText' }
		},
		{
			name: 'asset: remove source',
			role: 'supervisor',
			path: `/assets/${ids.asset}`,
			action: 'deleteSource',
			base: { sourceId: ids.source },
			fields: { sourceId: 'id' }
		},
		{
			name: 'asset: review',
			role: 'supervisor',
			path: `/assets/${ids.asset}`,
			action: 'review',
			base: { checkId: ids.check, outcome: 'fine', comment: 'Seen' },
			fields: { checkId: 'id', comment: 'longText' }
		},
		{
			name: 'rule set: save',
			role: 'supervisor',
			path: '/rule-sets',
			action: 'save',
			base: {
				id: ids.ruleSet,
				name: 'Site rule',
				kind: 'fixed',
				percent: '10',
				source: 'Common practice',
				edition: ''
			},
			fields: {
				id: 'optId',
				name: 'text',
				kind: 'enum',
				percent: 'number',
				source: 'text',
				edition: 'longText',
				'perKind.vane': 'optNumber'
			}
		},
		{
			name: 'follow-up: create',
			role: 'planner',
			path: '/follow-ups',
			action: 'create',
			base: {
				assetId: ids.asset,
				checkId: ids.check,
				title: 'Stiffen the base',
				assigneeId: '',
				dueDate: '',
				priority: 'normal',
				notes: ''
			},
			fields: {
				assetId: 'id',
				checkId: 'optId',
				title: 'text',
				assigneeId: 'optId',
				dueDate: 'date',
				priority: 'enum',
				notes: 'longText'
			}
		},
		{
			name: 'follow-up: update',
			role: 'planner',
			path: '/follow-ups',
			action: 'update',
			base: { id: ids.followUp, assigneeId: '', dueDate: '', priority: 'high', notes: '' },
			fields: {
				id: 'id',
				assigneeId: 'optId',
				dueDate: 'date',
				priority: 'enum',
				notes: 'longText'
			}
		},
		{
			name: 'follow-up: move',
			role: 'planner',
			path: '/follow-ups',
			action: 'move',
			base: { id: ids.followUp, status: 'scheduled' },
			fields: { id: 'id', status: 'enum' }
		},
		{
			name: 'user: create',
			role: 'admin',
			path: '/admin/users',
			action: 'create',
			base: {
				name: 'New Person',
				email: 'new.person@example.com',
				role: 'technician',
				password: 'a-long-password-2026',
				siteIds: [ids.site]
			},
			fields: { name: 'text', email: 'email', role: 'enum', password: 'password', siteIds: 'optId' }
		},
		{
			name: 'user: update',
			role: 'admin',
			path: '/admin/users',
			action: 'update',
			base: { id: ids.user, role: 'planner', siteIds: [ids.site] },
			fields: { id: 'id', role: 'enum', siteIds: 'optId' }
		},
		{
			name: 'user: disable',
			role: 'admin',
			path: '/admin/users',
			action: 'disable',
			base: { id: ids.user },
			fields: { id: 'id' }
		},
		{
			name: 'user: enable',
			role: 'admin',
			path: '/admin/users',
			action: 'enable',
			base: { id: ids.user },
			fields: { id: 'id' }
		},
		{
			name: 'mail: test message',
			role: 'admin',
			path: '/admin/mailbox',
			action: 'test',
			base: { to: 'someone@example.com' },
			fields: { to: 'email' }
		},
		{
			name: 'settings: units',
			role: 'technician',
			path: '/settings',
			action: 'units',
			base: { unitSystem: 'us' },
			fields: { unitSystem: 'enum' }
		},
		{
			name: 'settings: frequency unit',
			role: 'technician',
			path: '/settings',
			action: 'frequency',
			base: { frequencyUnit: 'CPM' },
			fields: { frequencyUnit: 'enum' }
		},
		{
			name: 'site: create',
			role: 'admin',
			path: '/admin/sites',
			action: 'createSite',
			base: { code: 'NEW-1', name: 'New works', recheckDays: '90' },
			fields: { code: 'code', name: 'text', recheckDays: 'int' }
		},
		{
			name: 'site: save',
			role: 'admin',
			path: '/admin/sites',
			action: 'updateSite',
			base: { id: ids.site, name: 'Kettle River Water Works', recheckDays: '30' },
			fields: { id: 'id', name: 'text', recheckDays: 'int' }
		},
		{
			name: 'site: add area',
			role: 'admin',
			path: '/admin/sites',
			action: 'addArea',
			base: { siteId: ids.site, name: 'Sludge press hall' },
			fields: { siteId: 'id', name: 'text' }
		},
		{
			name: 'site: rename area',
			role: 'admin',
			path: '/admin/sites',
			action: 'renameArea',
			base: { id: ids.area, name: 'Renamed hall' },
			fields: { id: 'id', name: 'text' }
		},
		{
			name: 'user: reset password',
			role: 'admin',
			path: '/admin/users',
			action: 'reset',
			base: { id: ids.user, password: 'another-long-pass-2026' },
			fields: { id: 'id', password: 'password' }
		}
	];

	test('form actions', async () => {
		test.setTimeout(60_000 + RUNS * 10_000);
		const before = snapshot();
		for (const c of cases()) {
			await fc.assert(
				fc.asyncProperty(badForm(c), async ({ form, broken }) => {
					const r = await postForm(c, form);
					expect(r.status, `${c.name} with ${broken}`).toBeGreaterThanOrEqual(400);
					expect(r.status, `${c.name} with ${broken}`).toBeLessThan(500);
					expect(
						showsMessage(r.body),
						`${c.name} with ${broken}: the page says what is wrong`
					).toBe(true);
				}),
				{ numRuns: RUNS }
			);
		}
		expect(snapshot()).toEqual(before);
	});

	test('import: bad files are refused, nothing imported', async () => {
		const before = snapshot();
		const post = async (action: string, body: FormData | string, type?: string) => {
			const res = await fetch(`${server.origin}/admin/import?/${action}`, {
				method: 'POST',
				headers: {
					origin: server.origin,
					accept: 'text/html',
					cookie: cookies.admin,
					...(type ? { 'content-type': type } : {})
				},
				body,
				redirect: 'manual'
			});
			return { status: res.status, body: await res.text() };
		};
		const csv = fc.oneof(
			fc.string({ maxLength: 300 }),
			fc
				.array(
					fc.array(
						fc.oneof(
							fc.string({ maxLength: 8 }),
							fc.constant('"'),
							fc.constant('NaN'),
							fc.constant('-1')
						),
						{ maxLength: 30 }
					),
					{ minLength: 1, maxLength: 30 }
				)
				.map((rows) => rows.map((r) => r.join(',')).join('\n')),
			fc.constant('tag,name\n' + '"'.repeat(5000)),
			fc.constant('tag,' + 'x,'.repeat(20_000))
		);
		await fc.assert(
			fc.asyncProperty(csv, fc.constantFrom('preview', 'import'), async (text, action) => {
				const form = new FormData();
				form.append('file', new Blob([text], { type: 'text/csv' }), 'assets.csv');
				const r = await post(action, form);
				// a preview of a file that happens to be valid is fine; an import must not succeed
				if (r.status === 200 && action === 'preview') return;
				expect(r.status, text.slice(0, 60)).toBeGreaterThanOrEqual(400);
				expect(r.status).toBeLessThan(500);
				expect(showsMessage(r.body)).toBe(true);
			}),
			{ numRuns: RUNS }
		);
		const notMultipart = await post('import', 'file=x', 'text/plain');
		expect(notMultipart.status).toBeGreaterThanOrEqual(400);
		expect(notMultipart.status).toBeLessThan(500);
		expect(snapshot()).toEqual(before);
	});

	const validItem = () => checkItem(ids.asset, 1185);

	/** JSON values that are wrong wherever a check's field wants something else. */
	const junk = fc.oneof(
		fc.constant(null),
		fc.constant(-1),
		fc.constant(-1e308),
		fc.constant(1e308),
		fc.constant(HUGE),
		fc.constant(''),
		fc.constant('NaN'),
		fc.boolean(),
		fc.constant([]),
		fc.constant({ $ne: null }),
		fc.constant(JSON.parse('{"__proto__": {"admin": true}}')),
		fc.object({ maxDepth: 2 })
	);

	test('sync push: bad batches get a 4xx, bad items are each rejected with a reason, nothing stored', async () => {
		test.setTimeout(120_000);
		const before = snapshot();
		const push = (body: string, type = 'application/json') =>
			fetch(`${server.origin}/api/sync/push`, {
				method: 'POST',
				headers: { 'content-type': type, origin: server.origin, cookie: cookies.technician },
				body
			});

		// the batch itself is wrong: not JSON, wrong shape, deep nesting, wrong content type
		const badBatch = fc.oneof(
			fc.string({ maxLength: 200 }).filter((s) => {
				try {
					JSON.parse(s);
					return false;
				} catch {
					return true;
				}
			}),
			fc
				.anything({ maxDepth: 4 })
				.filter(
					(v) =>
						!(
							typeof v === 'object' &&
							v !== null &&
							Array.isArray((v as { items?: unknown }).items)
						)
				)
				.map((v) => JSON.stringify(v) ?? 'undefined'),
			fc
				.integer({ min: 1000, max: 20_000 })
				.map((depth) => `{"clientId":"x","items":${'{"a":'.repeat(depth)}[]${'}'.repeat(depth)}}`),
			fc
				.integer({ min: 1000, max: 20_000 })
				.map((depth) => `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`),
			fc.constant(JSON.stringify({ clientId: 'x', items: Array.from({ length: 500 }, validItem) })),
			fc.constant(JSON.stringify({ clientId: HUGE, items: [] }))
		);
		await fc.assert(
			fc.asyncProperty(badBatch, async (body) => {
				const res = await push(body);
				expect(res.status, body.slice(0, 80)).toBeGreaterThanOrEqual(400);
				expect(res.status).toBeLessThan(500);
				expect(typeof (await res.json()).message).toBe('string');
			}),
			{ numRuns: RUNS * 2 }
		);
		// an item nested 20,000 deep is one bad item of the batch
		const deep = await push(
			`{"clientId":"x","items":[${'['.repeat(20_000)}${']'.repeat(20_000)}]}`
		);
		expect(deep.status).toBe(200);
		expect((await deep.json()).results).toMatchObject([{ status: 'rejected' }]);
		const wrongType = await push(
			JSON.stringify({ clientId: 'x', items: [validItem()] }),
			'text/plain'
		);
		expect(wrongType.status).toBe(415);

		// the batch is well formed but each item is wrong somewhere: answered per item (the
		// protocol's 200), every one rejected with a reason, so one bad check never holds up a shift
		const fields = Object.keys(validItem()).filter((k) => k !== 'notes');
		const badItem = fc
			.record({
				field: fc.constantFrom(...fields, 'modes.0.frequencyHz', 'modes.0.dampingRatio', 'unknown'),
				value: junk,
				extra: fc.boolean()
			})
			// (the fields that may be null are left out of the null case)
			.filter(
				({ field, value }) =>
					!(
						value === null &&
						['driveSetpointHz', 'replacesCheckId', 'modes.0.dampingRatio'].includes(field)
					)
			)
			.map(({ field, value, extra }) => {
				const item: Record<string, unknown> = validItem();
				if (field.startsWith('modes.'))
					(item.modes as Record<string, unknown>[])[0][field.slice(8)] = value;
				else item[field] = value;
				if (extra || field === 'unknown') item.isAdmin = true;
				return item;
			});
		await fc.assert(
			fc.asyncProperty(fc.array(badItem, { minLength: 1, maxLength: 5 }), async (items) => {
				const res = await push(JSON.stringify({ clientId: 'fuzz', items }));
				expect(res.status).toBe(200);
				const body = (await res.json()) as { results: { status: string; reason?: string }[] };
				expect(body.results).toHaveLength(items.length);
				for (const r of body.results) {
					expect(r.status, JSON.stringify(r)).toBe('rejected');
					expect(r.reason?.length).toBeGreaterThan(3);
				}
			}),
			{ numRuns: RUNS * 2 }
		);
		expect(snapshot()).toEqual(before);
	});

	test('query strings of the GET routes: a 400 with a message', async () => {
		const bad = fc.oneof(
			fc.record({
				key: fc.constantFrom('page', 'size'),
				value: fc.constantFrom('0', '-1', 'NaN', '1.5', 'Infinity', '1e309', HUGE.slice(0, 2000))
			}),
			fc.record({
				key: fc.constantFrom('verdict', 'stale', 'kind', 'sort', 'dir', 'format'),
				value: fc.constantFrom('bogus', '<script>', HUGE.slice(0, 2000), "' or 1=1 --")
			}),
			fc.record({
				key: fc.constantFrom('q', 'site', 'area'),
				value: fc.constant(HUGE.slice(0, 2000))
			}),
			fc.record({
				key: fc
					.string({ minLength: 1, maxLength: 10 })
					.filter(
						(k) =>
							![
								'site',
								'area',
								'verdict',
								'stale',
								'kind',
								'q',
								'sort',
								'dir',
								'page',
								'size',
								'format'
							].includes(k)
					),
				value: fc.string({ maxLength: 10 })
			})
		);
		await fc.assert(
			fc.asyncProperty(bad, async ({ key, value }) => {
				const res = await fetch(
					`${server.origin}/api/board?${new URLSearchParams({ [key]: value })}`,
					{ headers: { cookie: cookies.supervisor } }
				);
				expect(res.status, `${key}=${value.slice(0, 20)}`).toBe(400);
				expect(typeof (await res.json()).message).toBe('string');
			}),
			{ numRuns: RUNS * 2 }
		);
		await fc.assert(
			fc.asyncProperty(
				fc.constantFrom('-1', 'NaN', '1.5', 'abc', '9'.repeat(40), "0' or 1=1", ''),
				async (since) => {
					const res = await fetch(
						`${server.origin}/api/sync/pull?since=${encodeURIComponent(since)}`,
						{ headers: { cookie: cookies.technician } }
					);
					if (since === '') return; // an empty cursor is a first pull
					expect(res.status, since).toBe(400);
					expect(typeof (await res.json()).message).toBe('string');
				}
			)
		);
		for (const path of [
			'/api/recordings/not-a-uuid',
			'/api/recordings/00000000-0000-4000-a000-000000000000',
			'/api/reports/checks/00000000-0000-4000-a000-000000000000',
			'/api/reports/assets/x'
		]) {
			const res = await fetch(`${server.origin}${path}`, {
				headers: { cookie: cookies.supervisor }
			});
			expect(res.status, path).toBe(404);
		}
	});

	test('recording uploads: wrong type, oversize and pathological files are refused, oversize before the body is read', async () => {
		test.setTimeout(120_000);
		const before = snapshot();
		const upload = (body: BodyInit, type: string, q: Record<string, string> = {}) =>
			fetch(
				`${server.origin}/api/recordings?${new URLSearchParams({ id: crypto.randomUUID(), assetId: ids.asset, name: 'hit.csv', ...q })}`,
				{
					method: 'POST',
					headers: { 'content-type': type, origin: server.origin, cookie: cookies.technician },
					body
				}
			);
		const expect4xx = async (res: Response, what: string) => {
			expect(res.status, what).toBeGreaterThanOrEqual(400);
			expect(res.status, what).toBeLessThan(500);
			expect(typeof (await res.json()).message, what).toBe('string');
		};
		await expect4xx(await upload('<html><script>alert(1)</script></html>', 'text/html'), 'html');
		await expect4xx(await upload('MZ\x90\x00', 'application/x-msdownload'), 'exe');
		await expect4xx(await upload('t,a\n0,1\n', 'text/csv', { id: 'not-a-uuid' }), 'bad id');
		await expect4xx(
			await upload('t,a\n0,1\n', 'text/csv', { assetId: '00000000-0000-4000-a000-000000000000' }),
			'no asset'
		);
		await expect4xx(
			await upload('t,a\n0,1\n', 'text/csv', { sampleRateHz: '-5' }),
			'negative rate'
		);
		// 100,000 columns with a number in each (under this server's 512 kB body limit; the parser
		// test takes a million): the first version built a 32 kB column per cell, 3.2 GB
		const wide = Array.from({ length: 100_000 }, () => '1').join(',');
		const refused = await upload(`${wide}\n`, 'text/csv', { sampleRateHz: '1000' });
		expect(refused.status).toBe(422); // the upload's own answer to a file it cannot read
		expect((await refused.json()).message).toMatch(/has 100,000 columns/);
		const pathological = fc.oneof(
			fc.string({ maxLength: 500 }),
			fc.uint8Array({ maxLength: 2000 }).map((b) => Buffer.from(b)),
			fc.constant('time,accel\n' + '0,1\n'.repeat(3)),
			fc.constant('"'.repeat(100_000)),
			fc.constant('a,'.repeat(100_000)),
			fc.constant('time,accel\n' + 'NaN,NaN\n'.repeat(5000)),
			fc.constant('time,accel\n' + Array.from({ length: 3000 }, () => '0,1').join('\n')),
			fc.constant('RIFF\x24\x00\x00\x00WAVEfmt ')
		);
		await fc.assert(
			fc.asyncProperty(
				pathological,
				fc.constantFrom('text/csv', 'audio/wav'),
				async (body, type) => {
					await expect4xx(
						await upload(body as BodyInit, type),
						`${type} ${String(body).slice(0, 30)}`
					);
				}
			),
			{ numRuns: RUNS }
		);
		expect(snapshot()).toEqual(before);
	});

	/** Sends only the headers of a request that declares a huge body, and waits for the answer. */
	function declareOnly(
		path: string,
		type: string,
		length: number,
		cookie: string,
		accept = 'application/json'
	): Promise<{ status: number; ms: number }> {
		return new Promise((resolve, reject) => {
			const t0 = Date.now();
			const socket = connect(PORT, '127.0.0.1', () => {
				socket.write(
					`POST ${path} HTTP/1.1\r\nHost: 127.0.0.1:${PORT}\r\nOrigin: ${server.origin}\r\nCookie: ${cookie}\r\nAccept: ${accept}\r\nContent-Type: ${type}\r\nContent-Length: ${length}\r\n\r\n`
				);
				socket.write('x'.repeat(1000)); // a start, then nothing: the server must not wait for the rest
			});
			let data = '';
			socket.on('data', (d) => {
				data += d.toString();
				const m = /^HTTP\/1\.1 (\d{3})/.exec(data);
				if (m) {
					socket.destroy();
					resolve({ status: Number(m[1]), ms: Date.now() - t0 });
				}
			});
			socket.on('error', reject);
			setTimeout(
				() => (
					socket.destroy(),
					reject(new Error(`no answer to the first bytes of ${path} within 10 s`))
				),
				10_000
			);
		});
	}

	test('oversized bodies are refused from their declared length, before they are read', async () => {
		const q = new URLSearchParams({ id: crypto.randomUUID(), assetId: ids.asset, name: 'big.csv' });
		const recording = await declareOnly(
			`/api/recordings?${q}`,
			'text/csv',
			60 * 1024 * 1024,
			cookies.technician
		);
		expect(recording.status).toBe(413);
		const batch = await declareOnly(
			'/api/sync/push',
			'application/json',
			8 * 1024 * 1024,
			cookies.technician
		);
		expect(batch.status).toBe(413);
		const importFile = await declareOnly(
			'/admin/import?/preview',
			'multipart/form-data; boundary=x',
			10 * 1024 * 1024,
			cookies.admin,
			'text/html'
		);
		expect(importFile.status).toBe(413);
	});
});
