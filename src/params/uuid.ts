import type { ParamMatcher } from '@sveltejs/kit';

/** Lot, part and other ids are UUIDs; anything else never reaches a load function. */
export const match: ParamMatcher = (param) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(param);
