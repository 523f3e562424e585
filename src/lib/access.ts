/**
 * The role × route table: the single list the server guard (hooks.server.ts and every load,
 * action and endpoint) and the tests read. Keys are SvelteKit route ids. A route missing from this
 * table is refused (403) by the guard, and the route test fails, so nothing ships unlisted.
 */
import { EDITORS, FIELD_WORK, FLEET_WIDE, ROLES, type Role } from './roles.ts';

export type RouteAccess = 'public' | 'signed-in' | readonly Role[];

export interface RouteEntry {
	access: RouteAccess;
	/** a concrete path to probe, for routes with parameters */
	sample?: string;
	/** how the route test probes it */
	method?: 'GET' | 'POST';
}

const ALL: readonly Role[] = ROLES;
const FIELD = FIELD_WORK;
const FLEET = FLEET_WIDE;
const ADMIN: readonly Role[] = ['admin'];

export const ROUTE_ACCESS: Record<string, RouteEntry> = {
	'/': { access: 'signed-in' },
	'/login': { access: 'public' },
	'/logout': { access: 'signed-in', method: 'POST' },
	// a shell with no data (it renders from the tablet's IndexedDB, see (floor)/+layout.ts), so the
	// service worker can keep it for offline use; its data comes from the guarded sync API
	'/(floor)/field': { access: 'public' },
	'/offline': { access: 'public' },
	'/setup': { access: 'public', sample: '/setup?token=x' },
	'/setup/certificate': { access: 'public' },
	'/setup/certificate/detune-ca.crt': { access: 'public' },
	'/(app)/settings': { access: ALL },
	'/(app)/board': { access: FLEET },
	'/(app)/follow-ups': { access: ALL },
	'/(app)/follow-ups/export.csv': { access: ALL },
	'/(app)/follow-ups/export.xlsx': { access: ALL },
	'/(app)/admin/mailbox': { access: ADMIN },
	// sample: the demo's KRW-RWP-101 (a Kettle River asset, so the demo technician may read it)
	'/(app)/assets/[assetId=id]': {
		access: ALL,
		sample: '/assets/ee690482-2661-40f0-a1ba-59140aa07f60'
	},
	'/(app)/admin/users': { access: ADMIN },
	'/(app)/admin/sites': { access: ADMIN },
	'/(app)/rule-sets': { access: EDITORS },
	'/(app)/severity-limits': { access: EDITORS },
	'/(app)/admin/import': { access: ADMIN },
	'/(app)/admin/import/template.csv': { access: ADMIN },
	'/(app)/admin/audit': { access: ADMIN },
	'/(app)/admin/audit/export.csv': { access: ADMIN },
	'/api/health': { access: 'public' },
	'/api/session': { access: 'signed-in' },
	'/api/sync/pull': { access: ALL },
	'/api/checks/latest': { access: FLEET },
	'/api/board': { access: FLEET },
	'/api/reports/checks/[checkId=id]': {
		access: ALL,
		sample: '/api/reports/checks/00000000-0000-4000-a000-000000000000'
	},
	'/api/reports/checks/[checkId=id]/uff': {
		access: ALL,
		sample: '/api/reports/checks/00000000-0000-4000-a000-000000000000/uff'
	},
	'/api/reports/assets/[assetId=id]': {
		access: ALL,
		sample: '/api/reports/assets/ee690482-2661-40f0-a1ba-59140aa07f60'
	},
	'/api/recordings': { access: FIELD, method: 'POST' },
	'/api/recordings/[recordingId=id]': {
		access: ALL,
		sample: '/api/recordings/00000000-0000-4000-a000-000000000000'
	},
	'/api/sync/push': { access: FIELD, method: 'POST' }
};

/** The entry for a route id, or null when the route is not listed. */
export function routeEntry(routeId: string | null): RouteEntry | null {
	if (routeId === null) return null;
	return Object.hasOwn(ROUTE_ACCESS, routeId) ? ROUTE_ACCESS[routeId] : null;
}

/** Whether a user with `role` (null when signed out) may use the route. */
export function mayAccess(entry: RouteEntry, role: Role | null): boolean {
	if (entry.access === 'public') return true;
	if (role === null) return false;
	if (entry.access === 'signed-in') return true;
	return entry.access.includes(role);
}

export interface NavItem {
	href: string;
	label: string;
	routeId: string;
	icon:
		| 'field'
		| 'board'
		| 'follow-ups'
		| 'users'
		| 'sites'
		| 'rules'
		| 'severity'
		| 'import'
		| 'audit'
		| 'mail';
}

export const NAV: readonly NavItem[] = [
	{ href: '/field', label: 'Floor check', routeId: '/(floor)/field', icon: 'field' },
	{ href: '/board', label: 'Margin board', routeId: '/(app)/board', icon: 'board' },
	{ href: '/follow-ups', label: 'Follow-ups', routeId: '/(app)/follow-ups', icon: 'follow-ups' },
	{ href: '/rule-sets', label: 'Rule sets', routeId: '/(app)/rule-sets', icon: 'rules' },
	{
		href: '/severity-limits',
		label: 'Severity limits',
		routeId: '/(app)/severity-limits',
		icon: 'severity'
	},
	{ href: '/admin/users', label: 'Users', routeId: '/(app)/admin/users', icon: 'users' },
	{ href: '/admin/sites', label: 'Sites', routeId: '/(app)/admin/sites', icon: 'sites' },
	{ href: '/admin/import', label: 'Import', routeId: '/(app)/admin/import', icon: 'import' },
	{ href: '/admin/audit', label: 'Audit', routeId: '/(app)/admin/audit', icon: 'audit' },
	{ href: '/admin/mailbox', label: 'Mail', routeId: '/(app)/admin/mailbox', icon: 'mail' }
];

/** The navigation a role may use, in the table's order. */
export function navFor(role: Role): NavItem[] {
	return NAV.filter((n) =>
		n.routeId === '/(floor)/field'
			? FIELD_WORK.includes(role)
			: mayAccess(ROUTE_ACCESS[n.routeId], role)
	);
}

/** Where a role lands after sign-in. */
export function homeFor(role: Role): string {
	return role === 'technician' ? '/field' : role === 'planner' ? '/follow-ups' : '/board';
}
