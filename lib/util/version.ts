/**
 * The version of dotspec, as in package.json (a test keeps the two equal). Browser-safe: a
 * constant, so records made in a notebook carry it too.
 */
export const DOTSPEC_VERSION = "0.1.0";
