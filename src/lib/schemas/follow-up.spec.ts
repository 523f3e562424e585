import { describe, expect, it } from 'vitest';
import { followUpMove, followUpUpdate, parseListQuery } from './follow-up.ts';

const base = { id: 'f-1', assigneeId: '', dueDate: '', priority: 'normal', notes: '' };

describe('follow-up forms', () => {
	it('take a due date only when it is a real calendar day', () => {
		expect(followUpUpdate.safeParse({ ...base, dueDate: '2028-02-29' }).success).toBe(true); // a leap day
		for (const bad of [
			'2026-02-30',
			'2027-02-29',
			'2026-04-31',
			'2026-13-01',
			'2026-00-10',
			'2026-1-5'
		]) {
			const r = followUpUpdate.safeParse({ ...base, dueDate: bad });
			expect(r.success, bad).toBe(false);
		}
		expect(followUpUpdate.parse(base).dueDate).toBeNull();
	});

	it('never move a follow-up to retested by hand', () => {
		expect(followUpMove.safeParse({ id: 'f-1', status: 'retested' }).success).toBe(false);
		expect(followUpMove.safeParse({ id: 'f-1', status: 'done' }).success).toBe(true);
	});

	it('read the list address through one schema: a status outside the list is refused, empty is absent', () => {
		// the first version passed ?status= to the query unchecked
		const ok = parseListQuery(new URLSearchParams('status=open&overdue=yes&assignee='));
		expect(ok.success && ok.data).toEqual({ status: 'open', overdue: 'yes' });
		const bad = parseListQuery(new URLSearchParams('status=closed'));
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].message).toBe('status: open, scheduled, done, retested.');
		expect(parseListQuery(new URLSearchParams('assignee=nobody')).success).toBe(false);
	});
});

describe('a due date in the past', () => {
	it('is refused unless the record is back-dated; yesterday passes (a plant west of UTC)', async () => {
		const { pastDueProblem, followUpCreate } = await import('./follow-up.ts');
		expect(pastDueProblem('2020-01-01', '2026-12-02', false)).toMatch(
			/2020-01-01 has passed.*Back-dated record/
		);
		expect(pastDueProblem('2020-01-01', '2026-12-02', true)).toBeNull();
		expect(pastDueProblem('2026-12-01', '2026-12-02', false)).toBeNull();
		expect(pastDueProblem('2026-11-30', '2026-12-02', false)).not.toBeNull();
		expect(pastDueProblem(null, '2026-12-02', false)).toBeNull();
		// the checkbox arrives as "on"; left out, it is false
		const form = {
			assetId: 'a',
			checkId: '',
			title: 'Retest',
			assigneeId: '',
			dueDate: '2020-01-01',
			priority: 'high'
		};
		expect(followUpCreate.parse({ ...form, backdated: 'on' }).backdated).toBe(true);
		expect(followUpCreate.parse(form).backdated).toBe(false);
	});
});
