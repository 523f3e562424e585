import { describe, expect, it } from 'vitest';
import { inTurn, queued } from './turns.ts';

describe('writes taking turns', () => {
	it('run one at a time, in the order they came, each after a fresh event-loop turn', async () => {
		const order: string[] = [];
		const a = inTurn(() => {
			order.push('a');
			// a request that arrives while this write runs (a board read) is served before the next write
			setImmediate(() => order.push('read'));
		});
		const b = inTurn(() => order.push('b'));
		expect(queued()).toBe(2);
		await Promise.all([a, b]);
		expect(order).toEqual(['a', 'read', 'b']);
		expect(queued()).toBe(0);
	});

	it('keep going after one of them throws, and hand the error to its caller only', async () => {
		const failing = inTurn(() => {
			throw new Error('disk full');
		});
		const next = inTurn(() => 42);
		await expect(failing).rejects.toThrow('disk full');
		await expect(next).resolves.toBe(42);
	});
});
