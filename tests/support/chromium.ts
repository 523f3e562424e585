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
