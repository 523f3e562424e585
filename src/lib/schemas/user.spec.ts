import { describe, expect, it } from 'vitest';
import { createUserForm, resetPasswordForm, signInForm } from './user.ts';
import { fieldErrors, formToObject } from './form.ts';

describe('user forms', () => {
	it('give a message per bad field', () => {
		const r = createUserForm.safeParse({
			name: 'A',
			email: 'not-an-address',
			role: 'boss',
			password: 'short',
			siteIds: []
		});
		expect(r.success).toBe(false);
		const errors = fieldErrors(r.error!);
		expect(errors.name).toMatch(/at least 2 characters/);
		expect(errors.email).toMatch(/valid e-mail address/);
		expect(errors.role).toMatch(/Choose a role: technician, supervisor, planner, admin/);
		expect(errors.password).toMatch(/at least 10 characters/);
	});

	it('normalise a good entry', () => {
		const r = createUserForm.parse({
			name: '  Ines Halvorsen ',
			email: ' Ines@Example.COM',
			role: 'technician',
			password: 'long-enough-1',
			siteIds: ['s1']
		});
		expect(r.email).toBe('ines@example.com');
		expect(r.name).toBe('Ines Halvorsen');
	});

	it('refuse missing or oversize fields with a message', () => {
		expect(fieldErrors(signInForm.safeParse({}).error!)).toEqual({
			email: 'Enter your e-mail address.',
			password: 'Enter your password.'
		});
		expect(
			fieldErrors(resetPasswordForm.safeParse({ id: 'u', password: 'x'.repeat(201) }).error!)
				.password
		).toMatch(/at most 200/);
	});

	it('read multi-value form fields as lists', () => {
		const f = new FormData();
		f.append('siteIds', 'a');
		f.append('siteIds', 'b');
		f.append('name', 'X');
		expect(formToObject(f, ['siteIds', 'other'])).toEqual({
			siteIds: ['a', 'b'],
			name: 'X',
			other: []
		});
	});
});
