// Stands in for the `server-only` package under vitest (see vitest.config.ts): tests import server
// modules directly, outside React's server environment, where the real package throws.
export {};
