/**
 * Every audio input the tablet holds open, so that one call closes them all: on sign-out (a shared
 * tablet must not keep listening for the next person) and when Floor check is left.
 */
const closers = new Set<() => void>();

export function registerInput(close: () => void): () => void {
	closers.add(close);
	return () => closers.delete(close);
}

export function closeAllInputs(): void {
	for (const close of [...closers]) close();
}

export const inputsOpen = () => closers.size;
