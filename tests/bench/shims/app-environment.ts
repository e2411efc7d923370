// Outside SvelteKit the code is neither being built nor in dev mode.
export const building = false;
export const dev = false;
export const browser = false;
