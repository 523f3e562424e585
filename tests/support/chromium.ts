/**
 * How every test and benchmark starts Debian's chromium: its executable (never a downloaded
 * browser) and the flags this closed network needs (../shared/toolchain.md).
 */
export const CHROMIUM = '/usr/bin/chromium';
export const CHROMIUM_ARGS = [
	'--headless',
	'--no-sandbox',
	'--disable-gpu',
	'--disable-quic',
	'--no-first-run',
	'--disable-background-networking',
	'--disable-component-update',
	'--disable-sync'
];

/** Chromium's fake audio input playing `wav` (looped, or once), its permission prompt answered yes. */
export const fakeAudioInputArgs = (wav: string, loop: boolean) => [
	'--use-fake-device-for-media-stream',
	'--use-fake-ui-for-media-stream',
	`--use-file-for-fake-audio-capture=${wav}${loop ? '' : '%noloop'}`
];
