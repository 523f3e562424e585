/**
 * A second instance of the built app, on its own port and database, for tests that kill or
 * overload a server: the suite's shared server must not be disturbed.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';

export interface OwnServer {
	origin: string;
	dbFile: string;
	/** resolves with the first stdout line that matches */
	waitForLine(pattern: RegExp, timeoutMs?: number): Promise<string>;
	kill(signal: NodeJS.Signals): Promise<void>;
}

export async function startOwnServer(port: number, dir: string, env: Record<string, string> = {}): Promise<OwnServer> {
	mkdirSync(dir, { recursive: true });
	const origin = `http://127.0.0.1:${port}`;
	const dbFile = join(dir, 'own.db');
	const child: ChildProcess = spawn(process.execPath, ['build'], {
		env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ORIGIN: origin, DATABASE_URL: dbFile, DATA_DIR: join(dir, 'data'), MAIL_CATCHER: 'false', MAIL_JOBS: 'false', DETUNE_TEST_FAULTS: '1', ...env },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	const lines: string[] = [];
	const waiters: { pattern: RegExp; resolve: (l: string) => void }[] = [];
	let buffer = '';
	child.stdout!.on('data', (chunk: Buffer) => {
		buffer += chunk.toString();
		let nl;
		while ((nl = buffer.indexOf('\n')) >= 0) {
			const line = buffer.slice(0, nl);
			buffer = buffer.slice(nl + 1);
			lines.push(line);
			for (const w of [...waiters]) if (w.pattern.test(line)) (waiters.splice(waiters.indexOf(w), 1), w.resolve(line));
		}
	});
	child.stderr!.on('data', () => {});
	const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
	const deadline = Date.now() + 30_000;
	for (;;) {
		try {
			if ((await fetch(`${origin}/api/health`)).ok) break;
		} catch {
			/* not up yet */
		}
		if (Date.now() > deadline) throw new Error(`the server on ${origin} did not start: ${lines.join('\n')}`);
		await new Promise((r) => setTimeout(r, 200));
	}
	return {
		origin,
		dbFile,
		waitForLine(pattern, timeoutMs = 20_000) {
			const seen = lines.find((l) => pattern.test(l));
			if (seen) return Promise.resolve(seen);
			return new Promise((resolve, reject) => {
				const timer = setTimeout(() => reject(new Error(`no line like ${pattern} within ${timeoutMs} ms`)), timeoutMs);
				waiters.push({ pattern, resolve: (l) => (clearTimeout(timer), resolve(l)) });
			});
		},
		async kill(signal) {
			if (child.exitCode === null && child.signalCode === null) child.kill(signal);
			await exited;
		}
	};
}

export const cleanDir = (dir: string) => rmSync(dir, { recursive: true, force: true });
