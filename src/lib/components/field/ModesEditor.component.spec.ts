import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/svelte';
import ModesEditor from './ModesEditor.svelte';
import type { ModeInput } from '$lib/schemas/sync';

describe('ModesEditor (Floor check)', () => {
	it('adds a typed mode through the same limits a pushed check meets, and says what is wrong', async () => {
		const changes: ModeInput[][] = [];
		render(ModesEditor, { modes: [], onchange: (m: ModeInput[]) => changes.push(m) });
		expect(screen.getByText(/None yet/)).toBeTruthy();
		const freq = screen.getByLabelText(/^Natural frequency/);
		const add = screen.getByRole('button', { name: 'Add natural frequency' });
		await fireEvent.input(freq, { target: { value: '-3' } });
		await fireEvent.click(add);
		expect(screen.getByRole('alert').textContent).toMatch(/^Natural frequency/);
		expect(freq.getAttribute('aria-invalid')).toBe('true');
		expect(changes).toEqual([]);
		await fireEvent.input(freq, { target: { value: '24,6' } }); // a decimal comma is accepted
		await fireEvent.input(screen.getByLabelText(/^Damping ratio/), { target: { value: '0.02' } });
		await fireEvent.click(add);
		expect(changes).toHaveLength(1);
		expect(changes[0]).toEqual([
			expect.objectContaining({ frequencyHz: 24.6, dampingRatio: 0.02, direction: 'horizontal' })
		]);
		expect(screen.queryByRole('alert')).toBeNull();
	});

	it('lists the modes and removes one by its button', async () => {
		const modes = [
			{
				frequencyHz: 24.6,
				dampingRatio: 0.02,
				direction: 'horizontal',
				location: null,
				origin: 'typed'
			},
			{
				frequencyHz: 58,
				dampingRatio: null,
				direction: 'vertical',
				location: 'motor top',
				origin: 'estimate'
			}
		] as ModeInput[];
		let latest: ModeInput[] = modes;
		render(ModesEditor, { modes, onchange: (m: ModeInput[]) => (latest = m) });
		expect(screen.getByTestId('modes-list').querySelectorAll('li')).toHaveLength(2);
		expect(screen.getByText(/On this check \(2\)/)).toBeTruthy();
		await fireEvent.click(screen.getByRole('button', { name: 'Remove 24.60 Hz' }));
		expect(latest.map((m) => m.frequencyHz)).toEqual([58]);
	});
});
