#!/usr/bin/env bash
# `npm test`: format and lint checks, type checks, unit tests (with the engine's coverage floor), a production build and the
# Playwright suite against it in Debian's chromium. Needs no network but the package registries.
set -euo pipefail
cd "$(dirname "$0")/.."

# Debian's chromium drives the end-to-end tests; caddy and certutil (libnss3-tools) serve the
# plant-network tests (a reverse proxy, and a tablet that trusts a local certificate authority)
if [ ! -x /usr/bin/chromium ] || ! command -v caddy >/dev/null || ! command -v certutil >/dev/null; then
	if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null; then
		echo "[test] installing Debian's chromium, caddy and libnss3-tools with apt-get"
		apt-get update -qq
		DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium caddy libnss3-tools >/dev/null
	else
		echo "[test] The end-to-end tests need Debian's chromium, caddy and certutil." >&2
		echo "[test] Install them with: sudo apt-get update && sudo apt-get install -y chromium caddy libnss3-tools" >&2
		exit 1
	fi
fi

echo "[test] 0/4 format and lint (prettier --check, eslint)"
npm run --silent lint
echo "[test] 1/4 svelte-check"
npm run --silent check
echo "[test] 2/4 vitest (with coverage of src/lib/vibration)"
npx vitest run --coverage
echo "[test] 3/4 vite build"
npx vite build --logLevel warn
echo "[test] 4/4 playwright (Debian chromium, built app)"
npx playwright test
