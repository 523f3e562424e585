import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { safeNext } from './next.ts';

describe('safeNext', () => {
	it('keeps paths on this site, with their query', () => {
		expect(safeNext('/field')).toBe('/field');
		expect(safeNext('/board?site=abc&sort=worst')).toBe('/board?site=abc&sort=worst');
		expect(safeNext('/assets/ee690482-2661-40f0-a1ba-59140aa07f60')).toBe(
			'/assets/ee690482-2661-40f0-a1ba-59140aa07f60'
		);
	});

	it('refuses every way of leaving the site', () => {
		for (const bad of [
			'/\t/evil.example/phish', // the reported redirect: browsers drop the tab
			'/\n/evil.example',
			'/\r/evil.example',
			'//evil.example',
			'/\\evil.example',
			'\\\\evil.example',
			'/\\/evil.example',
			'https://evil.example',
			'http:/evil.example',
			'evil.example',
			' /field',
			'/%09/evil.example'.replace('%09', '\u0009'),
			'javascript:alert(1)',
			'',
			null
		])
			expect(safeNext(bad), JSON.stringify(bad)).toBeNull();
	});

	it('never yields a target that a browser would resolve to another origin (property)', () => {
		// the result, resolved as a browser resolves a Location header, stays on this origin
		fc.assert(
			fc.property(fc.string({ unit: 'binary', maxLength: 40 }), (tail) => {
				for (const input of [`/${tail}`, `//${tail}`, `/\\${tail}`, tail]) {
					const out = safeNext(input);
					if (out === null) continue;
					const resolved = new URL(out, 'https://plant.example');
					expect(resolved.origin).toBe('https://plant.example');
					expect(out.startsWith('/') && !out.startsWith('//')).toBe(true);
				}
			}),
			{ numRuns: 2000 }
		);
	});
});
