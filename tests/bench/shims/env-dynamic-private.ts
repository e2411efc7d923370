// Outside SvelteKit (the bench runs services in-process with tsx), `$env/dynamic/private` is process.env.
export const env: Record<string, string | undefined> = process.env;
