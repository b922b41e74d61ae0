// Set up for `npm run mutation:engine` only (tests/engine/vitest.mutation.config.ts): one fixed fast-check
// seed, so two mutation runs test each mutant against the same frames, and a quarter of the usual runs for
// properties that do not set their own count (see runs() in helpers.ts for those that do).
import fc from "fast-check";

fc.configureGlobal({ seed: 20261201, numRuns: 25 });
