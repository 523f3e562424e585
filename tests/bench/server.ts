/** The built app for the benchmarks: a throw-away database, and quiet about the made-up checks. */
import { startBuiltServer, type BuiltServer } from '../support/built-server.ts';

export { signInCookie, withDatabase } from '../support/built-server.ts';

/**
 * The benchmarks send made-up device summaries, so the server logs a difference for most checks
 * it recomputes: those lines are counted and reported once, everything else on stderr is passed on.
 */
export async function startServer(
	port: number,
	env: Record<string, string> = {}
): Promise<BuiltServer> {
	let differences = 0;
	const server = await startBuiltServer(port, {
		env,
		onStderrLine: (line) => {
			if (/^\[detune\] check \S+: device showed/.test(line)) differences++;
			else if (line.trim()) process.stderr.write(line + '\n');
		}
	});
	return {
		...server,
		async stop() {
			await server.stop();
			if (differences)
				console.log(
					`[bench] (the server logged ${differences} device/server differences of the made-up checks)`
				);
		}
	};
}
