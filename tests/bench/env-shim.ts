// Outside a SvelteKit server the private environment is the process's.
export const env = process.env;
