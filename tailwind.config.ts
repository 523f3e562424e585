import type { Config } from 'tailwindcss';

/** Detune's theme tokens; the values live in CSS variables in src/app.css (light and dark). */
export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: {
				sans: ['Inter', 'ui-sans-serif', 'system-ui', 'sans-serif']
			},
			colors: {
				canvas: 'var(--canvas)',
				surface: 'var(--surface)',
				'surface-2': 'var(--surface-2)',
				ink: 'var(--ink)',
				muted: 'var(--muted)',
				line: 'var(--line)',
				accent: 'var(--accent)',
				'accent-ink': 'var(--accent-ink)',
				clear: 'var(--clear)',
				'clear-bg': 'var(--clear-bg)',
				tight: 'var(--tight)',
				'tight-bg': 'var(--tight-bg)',
				conflict: 'var(--conflict)',
				'conflict-bg': 'var(--conflict-bg)',
				unchecked: 'var(--unchecked)',
				'unchecked-bg': 'var(--unchecked-bg)'
			}
		}
	}
} satisfies Config;
