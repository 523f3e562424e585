import { describe, expect, it } from 'vitest';
import { outcomeOf } from './outcome.ts';
import { doneAction, failAction } from '../server/forms.ts';

describe('form-action outcome', () => {
	it('shows a refusal under the form and row it was sent for only', () => {
		const refused = failAction(409, 'update', 'u1', { email: 'Taken.' }, { email: 'a@b.c' });
		expect(refused.status).toBe(409);
		const out = outcomeOf(refused.data);
		expect(out.errors('update', 'u1')).toEqual({ email: 'Taken.' });
		expect(out.values('update', 'u1')).toEqual({ email: 'a@b.c' });
		expect(out.errors('update', 'u2')).toEqual({});
		expect(out.errors('reset', 'u1')).toEqual({});
		expect(out.done('update', 'u1')).toBeUndefined();
	});

	it('never sends a typed password or a non-text value back', () => {
		const refused = failAction(
			400,
			'create',
			null,
			{ password: 'Too short.' },
			{ name: 'Ana', password: 'hunter2', siteIds: ['a', 'b'] }
		);
		expect(refused.data.values).toEqual({ name: 'Ana' });
	});

	it('reads a confirmation, and treats a row-less form as id null', () => {
		const out = outcomeOf(doneAction('create', null, 'Account created.'));
		expect(out.done('create')).toBe('Account created.');
		expect(out.done('create', null)).toBe('Account created.');
		expect(out.errors('create')).toEqual({});
		expect(outcomeOf(null).done('create')).toBeUndefined();
		expect(outcomeOf({ stage: 'preview' }).errors('create')).toEqual({});
	});
});
