import { beforeAll, describe, expect, it } from 'vitest';
import { freshDatabase } from '../test-db.ts';
import * as users from './users.ts';
import * as audit from './audit.ts';

let a1: string;
let a2: string;

beforeAll(async () => {
	await freshDatabase();
	a1 = users.create(
		{ email: 'a1@example.com', name: 'Admin One', role: 'admin', passwordHash: 'x', siteIds: [] },
		null
	);
	a2 = users.create(
		{ email: 'a2@example.com', name: 'Admin Two', role: 'admin', passwordHash: 'x', siteIds: [] },
		null
	);
});

describe('users', () => {
	it('never leaves the plant without an active admin', () => {
		users.setDisabled(a2, true, a1);
		expect(() => users.setDisabled(a1, true, a1)).toThrow(users.LastAdminError);
		expect(() => users.update(a1, { role: 'planner' }, a1)).toThrow(users.LastAdminError);
		users.setDisabled(a2, false, a1);
		users.setDisabled(a1, true, a2);
		expect(users.byId(a1)?.disabled).toBe(true);
	});

	it('refuses a second account for the same address, whatever its case', () => {
		expect(() =>
			users.create(
				{
					email: 'A1@example.com',
					name: 'Dup',
					role: 'technician',
					passwordHash: 'x',
					siteIds: []
				},
				null
			)
		).toThrow(users.DuplicateEmailError);
	});

	it('audits every change with before and after', () => {
		users.update(a2, { name: 'Admin Deux' }, a2);
		const entries = audit.forEntity('user', a2);
		expect(entries[0]).toMatchObject({
			action: 'update',
			before: { name: 'Admin Two' },
			after: { name: 'Admin Deux' },
			userName: 'Admin Deux'
		});
		expect(entries.map((e) => e.action)).toContain('create');
	});
});
