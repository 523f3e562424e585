/** Starts the built app on a loopback port with a throw-away database, for the benchmarks. */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface RunningServer {
	origin: string;
	dir: string;
	stop(): Promise<void>;
	process: ChildProcess;
}

export async function startServer(port: number, env: Record<string, string> = {}): Promise<RunningServer> {
	if (!existsSync('build/index.js')) throw new Error('No build: run `npx vite build` first (npm run bench does).');
	const dir = mkdtempSync(join(tmpdir(), 'detune-bench-'));
	const origin = `http://127.0.0.1:${port}`;
	const child = spawn(process.execPath, ['build'], {
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: origin, DATABASE_URL: join(dir, 'bench.db'), DATA_DIR: join(dir, 'data'), MAIL_CATCHER: 'false', MAIL_JOBS: 'false', ...env },
		stdio: ['ignore', 'ignore', 'pipe']
	});
	// the benchmarks send made-up device summaries, so the server logs a difference for most
	// checks it recomputes: those lines are counted, everything else is passed on
	let differences = 0;
	let rest = '';
	child.stderr!.on('data', (chunk: Buffer) => {
		const lines = (rest + chunk.toString()).split('\n');
		rest = lines.pop() ?? '';
		for (const line of lines) {
			if (/^\[detune\] check \S+: device showed/.test(line)) differences++;
			else if (line.trim()) process.stderr.write(line + '\n');
		}
	});
	child.once('exit', () => differences && console.log(`[bench] (the server logged ${differences} device/server differences of the made-up checks)`));
	const deadline = Date.now() + 30_000;
	for (;;) {
		try {
			const r = await fetch(`${origin}/api/health`);
			if (r.ok) break;
		} catch {
			/* not up yet */
		}
		if (Date.now() > deadline) throw new Error('the server did not start');
		await new Promise((r) => setTimeout(r, 200));
	}
	return {
		origin,
		dir,
		process: child,
		async stop() {
			const exited = new Promise((r) => child.once('exit', r));
			child.kill('SIGTERM');
			const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
			await exited;
			clearTimeout(timer);
			rmSync(dir, { recursive: true, force: true });
		}
	};
}

/** Signs in through the form action and returns the session cookie. */
export async function signInCookie(origin: string, email: string, password: string): Promise<string> {
	const res = await fetch(`${origin}/login`, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded', origin, accept: 'text/html' },
		body: new URLSearchParams({ email, password }),
		redirect: 'manual'
	});
	const cookie = res.headers.get('set-cookie')?.split(';')[0];
	if (!cookie) throw new Error(`sign-in failed (${res.status})`);
	return cookie;
}
