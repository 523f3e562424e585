import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/svelte';
import AssetCard from './AssetCard.svelte';
import type { PulledAsset } from '$lib/schemas/sync';

// an invented pump of the demo scenario, as the tablet holds it after a pull
const asset: PulledAsset = {
	id: 'a1',
	tag: 'KRW-RWP-109',
	name: 'Raw water pump 9',
	siteId: 's1',
	siteName: 'Kettle River Water Works',
	areaName: 'Raw Water Intake',
	machineKind: 'pump',
	driveType: 'vfd',
	minRpm: 720,
	maxRpm: 1180,
	nominalRpm: 1180,
	motorPoles: 6,
	slipPct: null,
	driveRatio: 1,
	skipBands: 3,
	machineGroup: null,
	ruleSetId: null,
	version: 1,
	sources: [
		{ id: 's-1', kind: 'shaft', label: '', params: { orders: [1, 2] }, sortOrder: 0 },
		{ id: 's-2', kind: 'vane', label: 'impeller', params: { count: 5 }, sortOrder: 1 }
	],
	lastCheck: {
		id: 'c1',
		checkedAt: Date.UTC(2026, 10, 23, 9, 32),
		checkedBy: 'Tomas Ferreira',
		measuredRpm: 991,
		verdict: 'conflict',
		modes: [
			{ frequencyHz: 17.2, dampingRatio: 0.021, direction: 'horizontal', location: 'Motor top' },
			{ frequencyHz: 48.5, dampingRatio: null, direction: 'sideways', location: null }
		]
	},
	openFollowUps: [
		{ id: 'f1', title: 'Brace the stand', status: 'scheduled', dueDate: '2027-01-15' }
	]
};

describe('AssetCard (Floor check)', () => {
	it('describes the sources in words, the last check and the open follow-ups', () => {
		render(AssetCard, {
			asset,
			ruleSet: null,
			hasDraft: true,
			onchange: () => {},
			onretest: () => {}
		});
		expect(screen.getByTestId('asset-heading').textContent).toContain(
			'KRW-RWP-109 · Raw water pump 9'
		);
		expect(screen.getByText('Shaft orders: 1×, 2×')).toBeTruthy();
		expect(screen.getByText('Vane pass (pump) “impeller”: 5 vanes')).toBeTruthy();
		expect(screen.getByText(/Detune default ±10 % \(common practice\)/)).toBeTruthy();
		expect(screen.getByTestId('draft-kept')).toBeTruthy();
		expect(screen.getByTestId('last-check').textContent).toMatch(
			/991 rpm · by Tomas Ferreira · 17\.20 Hz, 48\.50 Hz/
		);
		expect(screen.getByTestId('open-follow-ups').textContent).toContain(
			'Brace the stand · scheduled · due 15 Jan 2027'
		);
	});

	it('starts a retest from the last frequencies, dropping a direction the form does not know', async () => {
		const onretest = vi.fn();
		render(AssetCard, { asset, ruleSet: null, hasDraft: false, onchange: () => {}, onretest });
		await fireEvent.click(
			screen.getByRole('button', { name: 'Retest: start from these frequencies' })
		);
		expect(onretest).toHaveBeenCalledWith([
			{
				frequencyHz: 17.2,
				dampingRatio: 0.021,
				direction: 'horizontal',
				location: 'Motor top',
				origin: 'typed'
			},
			{ frequencyHz: 48.5, dampingRatio: null, direction: null, location: null, origin: 'typed' }
		]);
	});
});
