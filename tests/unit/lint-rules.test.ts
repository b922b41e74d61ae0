// The two architecture rules of eslint.config.mjs, checked with ESLint itself on snippets placed at
// chosen paths: who may import the database handle, and what lib/engine may import.
import { ESLint } from "eslint";
import { beforeAll, describe, expect, it, vi } from "vitest";

const eslint = new ESLint({ cwd: process.cwd() });

// Loading the config and typescript-eslint takes seconds on a busy machine; do it once, up front.
vi.setConfig({ testTimeout: 30_000 });
beforeAll(async () => {
  await eslint.lintText("export {};\n", { filePath: "lib/warm-up.ts" });
}, 120_000);

async function restrictedImports(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.ruleId === "no-restricted-imports").map((m) => m.message);
}

const DB_IMPORTS = [
  'import { db } from "@/db";',
  'import { db } from "@/db/index";',
  'import { db } from "../../db";',
  'import { db } from "../../db/index";',
];

describe("the database handle", () => {
  it.each(["app/(app)/home/page.tsx", "components/people-table.tsx", "lib/auth/guard.ts", "lib/mail/send-mail.ts"])(
    "is refused in %s",
    async (filePath) => {
      for (const code of DB_IMPORTS) expect(await restrictedImports(filePath, `${code}\nexport const x = db;`)).toHaveLength(1);
    },
  );

  it.each(["lib/data/users.ts", "lib/auth/server.ts", "db/seed.ts", "scripts/seed.ts", "tests/integration/x.test.ts"])(
    "is allowed in %s",
    async (filePath) => {
      expect(await restrictedImports(filePath, 'import { db } from "@/db";\nexport const x = db;')).toEqual([]);
    },
  );

  it("leaves the schema (tables and types) open to everyone", async () => {
    expect(await restrictedImports("components/x.tsx", 'import type { User } from "@/db/schema";\nexport type X = User;')).toEqual([]);
  });
});

describe("lib/engine", () => {
  it.each([
    "react",
    "react-dom/client",
    "next/navigation",
    "@/db",
    "@/db/schema",
    "pg",
    "drizzle-orm",
    "drizzle-orm/pg-core",
    "better-auth",
    "@/lib/auth/server",
    "node:fs",
    "fs",
    "node:path",
    "path",
    "node:child_process",
    "child_process",
    "node:net",
    "http",
    "https",
  ])("may not import %s", async (specifier) => {
    const code = `import * as m from "${specifier}";\nexport const x = m;`;
    expect(await restrictedImports("lib/engine/solve.ts", code)).toHaveLength(1);
  });

  it("may import its own modules and pure libraries", async () => {
    const code = 'import { a } from "./model";\nimport { b } from "@/lib/engine/dofs";\nexport const x = [a, b];';
    expect(await restrictedImports("lib/engine/solve.ts", code)).toEqual([]);
  });
});

describe("the whole tree", () => {
  // The rules above only help if the real files obey them; CI runs this, so a violation cannot land.
  it("passes ESLint with no errors", async () => {
    const results = await eslint.lintFiles(["."]);
    const errors = results.flatMap((r) =>
      r.messages.filter((m) => m.severity === 2).map((m) => `${r.filePath.slice(process.cwd().length + 1)}:${m.line} ${m.ruleId ?? ""} ${m.message}`),
    );
    expect(errors).toEqual([]);
  }, 120_000);
});
