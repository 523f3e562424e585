import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/svelte';
import OutboxPanel from './OutboxPanel.svelte';
import { syncManager } from '$lib/offline/outbox.svelte';
import type { CheckPush } from '$lib/schemas/sync';
import type { OutboxItem } from '$lib/offline/store';

const item = (
	id: string,
	tag: string,
	status: OutboxItem['status'],
	reason: string | null
): OutboxItem => ({
	id,
	authorId: 'u1',
	createdAt: Date.now() - 5 * 60_000,
	payload: {} as CheckPush,
	status,
	reason,
	attempts: status === 'rejected' ? 1 : 0,
	lastAttemptAt: null,
	display: { tag, name: '', verdict: 'tight' }
});

afterEach(() => {
	syncManager.items = [];
	syncManager.state = 'idle';
	syncManager.message = null;
	vi.restoreAllMocks();
	vi.unstubAllGlobals();
});

describe('OutboxPanel (Floor check)', () => {
	it('counts what waits, says the state and how old the oldest is, and names why the server refused one', () => {
		syncManager.items = [
			item('i1', 'KRW-RWP-101', 'pending', null),
			item('i2', 'LBM-IDF-110', 'rejected', 'Recording hit.csv: Row 3, column 2: expected a number')
		];
		syncManager.state = 'offline';
		syncManager.message = 'No network: your checks stay on this tablet.';
		render(OutboxPanel);
		expect(screen.getByTestId('outbox-count').textContent).toBe('2');
		expect(screen.getByLabelText('2 checks waiting')).toBeTruthy();
		expect(screen.getByTestId('sync-state').textContent).toBe('Offline');
		expect(screen.getByText('5 min ago')).toBeTruthy();
		expect(screen.getByRole('status').textContent).toContain('No network');
		const rows = screen.getByTestId('outbox-items').querySelectorAll('li');
		expect(rows).toHaveLength(2);
		expect(rows[1].textContent).toContain(
			'Refused by the server: Recording hit.csv: Row 3, column 2: expected a number'
		);
		// only the refused one offers a retry and a discard
		expect(screen.getAllByRole('button', { name: 'Try again' })).toHaveLength(1);
		expect(screen.getAllByRole('button', { name: 'Discard' })).toHaveLength(1);
	});

	it('retries a refused check on a tap, and discards one only after the person confirms', async () => {
		syncManager.items = [item('i2', 'LBM-IDF-110', 'rejected', 'refused (422)')];
		const retry = vi.spyOn(syncManager, 'retry').mockResolvedValue();
		const discard = vi.spyOn(syncManager, 'discard').mockResolvedValue();
		render(OutboxPanel);
		await fireEvent.click(screen.getByRole('button', { name: 'Try again' }));
		expect(retry).toHaveBeenCalledWith('i2');
		vi.stubGlobal('confirm', vi.fn().mockReturnValueOnce(false).mockReturnValueOnce(true));
		await fireEvent.click(screen.getByRole('button', { name: 'Discard' }));
		expect(discard).not.toHaveBeenCalled();
		await fireEvent.click(screen.getByRole('button', { name: 'Discard' }));
		expect(discard).toHaveBeenCalledWith('i2');
	});

	it('turns Sync now off while a sync runs', () => {
		syncManager.state = 'syncing';
		render(OutboxPanel);
		expect((screen.getByRole('button', { name: 'Sync now' }) as HTMLButtonElement).disabled).toBe(
			true
		);
		expect(screen.getByTestId('sync-state').textContent).toBe('Syncing…');
	});
});
