/**
 * Settings from the environment. SvelteKit's $env/dynamic/private is filled when the server
 * starts; code loaded outside a server (vitest, command-line tools) falls back to process.env.
 */
import { env } from '$env/dynamic/private';

export function setting(name: string): string | undefined {
	const v = env[name] ?? process.env[name];
	return v === '' ? undefined : v;
}
