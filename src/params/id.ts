import type { ParamMatcher } from '@sveltejs/kit';

/** Positive integer ids only; anything else is a 404 before any code runs. */
export const match: ParamMatcher = (param) => /^[1-9][0-9]{0,9}$/.test(param);
