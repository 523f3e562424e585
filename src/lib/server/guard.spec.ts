import { describe, expect, it } from 'vitest';
import { ROUTE_ACCESS, navFor, homeFor } from '../access.ts';
import { ROLES } from '../roles.ts';
import { decide } from './guard.ts';

describe('role guard', () => {
	it('follows the role × route table for every route and role', () => {
		for (const [routeId, entry] of Object.entries(ROUTE_ACCESS)) {
			expect(decide(routeId, null)).toEqual(
				entry.access === 'public'
					? { ok: true }
					: { ok: false, status: 401, reason: 'Sign in to continue.' }
			);
			for (const role of ROLES) {
				const allowed =
					entry.access === 'public' || entry.access === 'signed-in' || entry.access.includes(role);
				expect(decide(routeId, role).ok, `${role} on ${routeId}`).toBe(allowed);
			}
		}
	});

	it('refuses a route that is not in the table, even for an admin', () => {
		expect(decide('/(app)/secret', 'admin')).toMatchObject({ ok: false, status: 403 });
	});

	it('applies the design’s permissions: only admins manage users, technicians do not see the board', () => {
		expect(decide('/(app)/admin/users', 'supervisor')).toMatchObject({ ok: false, status: 403 });
		expect(decide('/(app)/board', 'technician')).toMatchObject({ ok: false, status: 403 });
		// Floor check is a data-free shell; its data comes from the guarded sync API
		expect(decide('/(floor)/field', null)).toEqual({ ok: true });
		expect(decide('/api/sync/push', 'planner')).toMatchObject({ ok: false, status: 403 });
		expect(navFor('technician').map((n) => n.label)).toEqual(['Floor check', 'Follow-ups']);
		expect(navFor('admin').map((n) => n.label)).toEqual([
			'Floor check',
			'Margin board',
			'Follow-ups',
			'Rule sets',
			'Severity limits',
			'Users',
			'Sites',
			'Import',
			'Audit',
			'Mail'
		]);
		expect(navFor('supervisor').map((n) => n.label)).toEqual([
			'Floor check',
			'Margin board',
			'Follow-ups',
			'Rule sets',
			'Severity limits'
		]);
		expect(homeFor('technician')).toBe('/field');
	});
});
