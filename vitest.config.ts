import { configDefaults, defineConfig } from "vitest/config";
import path from "node:path";

// `server-only` throws outside React's server environment; tests import server modules directly.
const alias = {
  "@": path.resolve(import.meta.dirname),
  "server-only": path.resolve(import.meta.dirname, "tests/support/server-only.ts"),
};

// Four projects: unit (pure code, engine), integration (real PostgreSQL, fake SMTP/S3 started by
// scripts/test.mjs), browser (playwright-core driving Debian's chromium against a served build), and
// outage (stops PostgreSQL under the served build and starts it again, so it runs alone, last).
// groupOrder runs them one after the other, so integration tests and browser journeys never share
// the test database at the same moment.
const OUTAGE_TESTS = ["tests/integration/database-outage.test.ts"];
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: "unit",
          include: [
            "tests/unit/**/*.test.ts",
            "tests/engine/**/*.test.ts",
            "tests/standards/**/*.test.ts",
            "tests/libraries/**/*.test.ts",
          ],
          environment: "node",
          sequence: { groupOrder: 0 },
        },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          exclude: [...configDefaults.exclude, ...OUTAGE_TESTS],
          environment: "node",
          // Tests that call handlers in-process stand in for scripts/serve.mjs: they set the client's
          // address in x-gusset-client-address themselves (lib/auth/client-address.ts).
          env: { GUSSET_CLIENT_ADDRESS_FROM_SERVER: "1" },
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
          sequence: { groupOrder: 1 },
        },
      },
      {
        resolve: { alias },
        test: {
          name: "browser",
          include: ["tests/browser/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          // How many of a file's concurrent tests run at once: the page walk's visits, which only read and
          // spend part of their time waiting (the network going quiet, the server). On two busy cores two at
          // once did as well as four, and five ran past the tests' time limits.
          maxConcurrency: 2,
          testTimeout: 60_000,
          hookTimeout: 120_000,
          sequence: { groupOrder: 2 },
        },
      },
      {
        resolve: { alias },
        test: {
          name: "outage",
          include: OUTAGE_TESTS,
          environment: "node",
          testTimeout: 60_000,
          hookTimeout: 120_000,
          sequence: { groupOrder: 3 },
        },
      },
    ],
  },
});
