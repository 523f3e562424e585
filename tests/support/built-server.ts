/**
 * The built app (`node build`) on a loopback port of its own, with its own database, for the
 * benchmarks and for the end-to-end tests that load, kill or lock up a server (the suite's shared
 * server must not be disturbed). Plus the small helpers those callers share.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';

export interface BuiltServer {
	origin: string;
	/** the server's process (for `npm run serve`, npm's: the server is its child) */
	pid: number;
	dir: string;
	dbFile: string;
	/** resolves with the first stdout line that matches */
	waitForLine(pattern: RegExp, timeoutMs?: number): Promise<string>;
	kill(signal: NodeJS.Signals): Promise<void>;
	/** SIGTERM (SIGKILL after 5 s), then the folder is removed when this module made it */
	stop(): Promise<void>;
}

export interface StartOptions {
	/** where the database and uploads go; a fresh temporary folder when left out */
	dir?: string;
	env?: Record<string, string>;
	/** each line the server writes to stderr; dropped when left out */
	onStderrLine?: (line: string) => void;
	/**
	 * start it as `npm run serve` does, with that script's defaults (ORIGIN, BODY_SIZE_LIMIT), on
	 * localhost, instead of `node build` with an ORIGIN on 127.0.0.1
	 */
	asServeScript?: boolean;
	/**
	 * a push fault for tests/support/fault-entry.js (`hold@2`, `fail@2`, `fail-after-insert@1`):
	 * the server then starts through that test-only entry instead of `node build`
	 */
	fault?: string;
	/** another entry than `node build` (e.g. serve-https.js), with the origin it serves */
	entry?: { script: string; origin: string; health: string };
}

/** Splits a stream's chunks into lines. */
function lines(onLine: (line: string) => void) {
	let rest = '';
	return (chunk: Buffer) => {
		const parts = (rest + chunk.toString()).split('\n');
		rest = parts.pop() ?? '';
		for (const p of parts) onLine(p);
	};
}

export async function startBuiltServer(
	port: number,
	options: StartOptions = {}
): Promise<BuiltServer> {
	if (!existsSync('build/index.js')) throw new Error('No build: run `npx vite build` first.');
	const ownDir = options.dir === undefined;
	const dir = options.dir ?? mkdtempSync(join(tmpdir(), 'detune-server-'));
	mkdirSync(dir, { recursive: true });
	const serve = options.asServeScript === true;
	const origin =
		options.entry?.origin ?? (serve ? `http://localhost:${port}` : `http://127.0.0.1:${port}`);
	const env: Record<string, string> = {
		PORT: String(port),
		DATABASE_URL: join(dir, 'detune.db'),
		DATA_DIR: join(dir, 'data'),
		MAIL_CATCHER: 'false',
		SEED_DEMO: 'true',
		MAIL_JOBS: 'false',
		...(serve ? {} : { HOST: '127.0.0.1', ORIGIN: origin }),
		...options.env
	};
	const base = { ...process.env, ...env };
	if (serve) for (const k of ['ORIGIN', 'HOST', 'BODY_SIZE_LIMIT']) if (!(k in env)) delete base[k];
	// the script runs under npm and a shell: its own process group, so that a signal reaches node
	const child = serve
		? spawn('npm', ['run', '--silent', 'serve'], {
				env: base,
				stdio: ['ignore', 'pipe', 'pipe'],
				detached: true
			})
		: spawn(
				process.execPath,
				[options.entry?.script ?? (options.fault ? 'tests/support/fault-entry.js' : 'build')],
				{
					env: options.fault ? { ...base, DETUNE_FAULT: options.fault } : base,
					stdio: ['ignore', 'pipe', 'pipe']
				}
			);
	const seen: string[] = [];
	const waiters: { pattern: RegExp; resolve: (l: string) => void }[] = [];
	child.stdout!.on(
		'data',
		lines((line) => {
			if (seen.length < 1000) seen.push(line);
			for (const w of [...waiters])
				if (w.pattern.test(line)) {
					waiters.splice(waiters.indexOf(w), 1);
					w.resolve(line);
				}
		})
	);
	child.stderr!.on('data', lines(options.onStderrLine ?? (() => {})));
	const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
	const deadline = Date.now() + 30_000;
	for (;;) {
		try {
			if ((await fetch(options.entry?.health ?? `${origin}/api/health`)).ok) break;
		} catch {
			/* not up yet */
		}
		if (Date.now() > deadline)
			throw new Error(`the server on ${origin} did not start: ${seen.join('\n')}`);
		await new Promise((r) => setTimeout(r, 200));
	}
	const kill = async (signal: NodeJS.Signals) => {
		if (child.exitCode === null && child.signalCode === null) {
			if (serve) process.kill(-child.pid!, signal);
			else child.kill(signal);
		}
		await exited;
	};
	return {
		origin,
		pid: child.pid!,
		dir,
		dbFile: env.DATABASE_URL,
		waitForLine(pattern, timeoutMs = 20_000) {
			const line = seen.find((l) => pattern.test(l));
			if (line) return Promise.resolve(line);
			return new Promise((resolve, reject) => {
				const timer = setTimeout(
					() => reject(new Error(`no line like ${pattern} within ${timeoutMs} ms`)),
					timeoutMs
				);
				waiters.push({ pattern, resolve: (l) => (clearTimeout(timer), resolve(l)) });
			});
		},
		kill,
		async stop() {
			const timer = setTimeout(() => void kill('SIGKILL'), 5000);
			await kill('SIGTERM');
			clearTimeout(timer);
			if (ownDir) rmSync(dir, { recursive: true, force: true });
		}
	};
}

export const cleanDir = (dir: string) => rmSync(dir, { recursive: true, force: true });

/** Posts the sign-in form as a browser would (with its Origin), answering the raw response. */
export function postSignIn(origin: string, email: string, password: string): Promise<Response> {
	return fetch(`${origin}/login`, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded', origin, accept: 'text/html' },
		body: new URLSearchParams({ email, password }),
		redirect: 'manual'
	});
}

/** Signs in and returns the session cookie (`name=value`). */
export async function signInCookie(
	origin: string,
	email: string,
	password: string
): Promise<string> {
	const res = await postSignIn(origin, email, password);
	const cookie = res.headers.get('set-cookie')?.split(';')[0];
	if (!cookie) throw new Error(`sign-in failed (${res.status})`);
	return cookie;
}

/** Opens the server's database file for a moment (WAL: safe beside the running server). */
export function withDatabase<T>(
	file: string,
	read: (db: Database.Database) => T,
	options: { readonly?: boolean } = { readonly: true }
): T {
	const db = new Database(file, options);
	try {
		return read(db);
	} finally {
		db.close();
	}
}
