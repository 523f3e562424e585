import { describe, expect, it } from 'vitest';
import { render } from '@testing-library/svelte';
import VerdictBadge from './VerdictBadge.svelte';

describe('VerdictBadge', () => {
	it('shows the word and a mark of its own for every verdict, never colour alone', () => {
		const marks = new Set<string>();
		for (const verdict of ['clear', 'tight', 'conflict', 'unchecked'] as const) {
			const { container, unmount } = render(VerdictBadge, { verdict });
			const badge = container.querySelector('[data-verdict]')!;
			expect(badge.getAttribute('data-verdict')).toBe(verdict);
			expect(badge.textContent?.trim()).toBe(verdict);
			const svg = badge.querySelector('svg');
			expect(svg).not.toBeNull();
			marks.add(svg!.innerHTML);
			unmount();
		}
		expect(marks.size).toBe(4); // four different shapes
	});

	it('reads a missing verdict as unchecked', () => {
		const { container } = render(VerdictBadge, { verdict: null });
		expect(container.querySelector('[data-verdict]')!.getAttribute('data-verdict')).toBe(
			'unchecked'
		);
	});
});
