/**
 * Opening the tablet's audio input for a tap capture: getUserMedia with every voice-call treatment
 * off (echo cancellation, noise suppression and automatic gain would reshape a ring-down), the
 * device's own sample rate unless one is asked for, 1 or 2 channels; an AudioContext at that rate
 * and the capture worklet, whose blocks go straight to the analysis worker on a MessageChannel.
 * Browser only.
 */
import workletUrl from './tap.worklet.ts?worker&url';
import { registerInput } from './open-inputs.ts';

export interface OpenedInput {
	label: string;
	sampleRateHz: number;
	channels: 1 | 2;
	close: () => void;
}

/** Why the input cannot open, said so a technician can act on it. */
export function inputProblem(err: unknown): string {
	const name = (err as { name?: string })?.name ?? '';
	if (name === 'NotAllowedError' || name === 'SecurityError')
		return 'The browser was not allowed to use the audio input. Allow the microphone for Detune in the browser’s site settings, then press Start again.';
	if (name === 'NotFoundError' || name === 'OverconstrainedError')
		return 'No audio input was found. Plug in the USB accelerometer or audio interface, then press Start again.';
	if (name === 'NotReadableError')
		return 'The audio input is in use by another app, or the device stopped answering. Close the other app or re-plug the device.';
	return err instanceof Error ? err.message : String(err);
}

export function canCapture(): string | null {
	if (typeof navigator === 'undefined' || !navigator.mediaDevices?.getUserMedia)
		return window.isSecureContext
			? 'This browser cannot record audio. Use a current Chrome, Edge or Firefox.'
			: 'Recording needs Detune’s secure (https://) address: the browser allows an audio input only there.';
	if (typeof AudioWorkletNode === 'undefined')
		return 'This browser cannot process audio input (no AudioWorklet). Use a current Chrome, Edge or Firefox.';
	return null;
}

/**
 * Opens the input and connects it to `worker`: `open(port, sampleRateHz)` says what to send the
 * worker with the port (a capture or a calibration).
 */
export async function openInput(opts: {
	deviceId: string | null;
	channels: 1 | 2;
	sampleRateHz: number | null;
	worker: Worker;
	open: (port: MessagePort, sampleRateHz: number) => Record<string, unknown>;
}): Promise<OpenedInput> {
	const stream = await navigator.mediaDevices.getUserMedia({
		audio: {
			...(opts.deviceId ? { deviceId: { exact: opts.deviceId } } : {}),
			echoCancellation: false,
			noiseSuppression: false,
			autoGainControl: false,
			channelCount: { ideal: opts.channels }
		}
	});
	const track = stream.getAudioTracks()[0];
	const got = track.getSettings();
	let ctx: AudioContext | null = null;
	try {
		if (opts.channels === 2 && (got.channelCount ?? 1) < 2)
			throw new Error(
				`${track.label || 'The input'} gives one channel only: choose one channel, or an interface with two inputs for the hammer.`
			);
		ctx = new AudioContext({
			sampleRate: opts.sampleRateHz ?? got.sampleRate ?? undefined,
			latencyHint: 'interactive'
		});
		await ctx.audioWorklet.addModule(workletUrl);
		const source = ctx.createMediaStreamSource(stream);
		const node = new AudioWorkletNode(ctx, 'detune-tap-input', {
			numberOfInputs: 1,
			numberOfOutputs: 0,
			channelCount: opts.channels,
			channelCountMode: 'explicit',
			channelInterpretation: 'discrete',
			processorOptions: { channels: opts.channels, blockFrames: 512 }
		});
		const channel = new MessageChannel();
		node.port.postMessage({ port: channel.port1 }, [channel.port1]);
		opts.worker.postMessage(opts.open(channel.port2, ctx.sampleRate), [channel.port2]);
		source.connect(node);
		if (ctx.state === 'suspended') await ctx.resume();
		const context = ctx;
		let unregister = () => {};
		const close = () => {
			unregister();
			node.port.postMessage({ close: true });
			source.disconnect();
			for (const t of stream.getTracks()) t.stop();
			void context.close();
		};
		unregister = registerInput(close);
		return {
			label: track.label || 'Audio input',
			sampleRateHz: context.sampleRate,
			channels: opts.channels,
			close
		};
	} catch (err) {
		for (const t of stream.getTracks()) t.stop();
		void ctx?.close();
		throw err;
	}
}
