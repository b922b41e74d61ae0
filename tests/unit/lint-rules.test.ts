// The architecture rules of eslint.config.mjs, checked with ESLint itself on snippets placed at chosen
// paths: the layer table (DEVELOPERS.md, Layout), who may import the database handle, and what lib/engine
// may import; then the whole tree.
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
  return result.messages.filter((m) => m.ruleId === "@typescript-eslint/no-restricted-imports").map((m) => m.message);
}

const DB_IMPORTS = [
  'import { db } from "@/db";',
  'import { db } from "@/db/index";',
  'import { db } from "../../db";',
  'import { db } from "../../db/index";',
];

describe("the database handle", () => {
  it.each([
    "app/(app)/home/page.tsx",
    "components/people-table.tsx",
    "lib/auth/session.ts",
    "lib/use-cases/people.ts",
    "lib/mail/send-mail.ts",
    "proxy.ts",
  ])("is refused in %s", async (filePath) => {
    for (const code of DB_IMPORTS) expect(await restrictedImports(filePath, `${code}\nexport const x = db;`)).not.toEqual([]);
  });

  it.each([
    "lib/data/users.ts",
    "lib/jobs/enqueue.ts",
    "lib/auth/server.ts",
    "db/seed.ts",
    "scripts/seed.ts",
    "tests/integration/x.test.ts",
  ])("is allowed in %s", async (filePath) => {
    expect(await restrictedImports(filePath, 'import { db } from "@/db";\nexport const x = db;')).toEqual([]);
  });

  it("leaves the schema (tables and types) open to everyone", async () => {
    expect(
      await restrictedImports("lib/use-cases/x.ts", 'import type { User } from "@/db/schema";\nexport type X = User;'),
    ).toEqual([]);
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
    expect(await restrictedImports("lib/engine/solve.ts", code)).not.toEqual([]);
  });

  it("may import its own modules and pure libraries", async () => {
    const code = 'import { a } from "./model";\nimport { b } from "@/lib/engine/dofs";\nexport const x = [a, b];';
    expect(await restrictedImports("lib/engine/solve.ts", code)).toEqual([]);
  });
});

describe("the layer table", () => {
  // [importing file, imported module, allowed?] — each row a rule of DEVELOPERS.md's table.
  const CASES: [string, string, boolean][] = [
    ["lib/domain/roles.ts", "@/lib/auth/session", false],
    ["lib/domain/roles.ts", "@/lib/server-env", false],
    ["lib/domain/schemas/users.ts", "@/lib/data/users", false],
    ["lib/server-env.ts", "@/lib/domain/roles", false],
    ["db/seed.ts", "@/lib/domain/roles", true],
    ["db/seed.ts", "@/lib/data/users", false],
    ["lib/mail/templates.ts", "@/lib/domain/roles", true],
    ["lib/mail/templates.ts", "@/lib/auth/server", false],
    ["lib/data/users.ts", "@/lib/domain/errors", true],
    ["lib/data/users.ts", "@/lib/auth/session", false],
    ["lib/data/users.ts", "@/lib/use-cases/people", false],
    ["lib/data/users.ts", "@/lib/jobs/enqueue", false],
    ["lib/jobs/enqueue.ts", "@/lib/data/transaction", true],
    ["lib/jobs/enqueue.ts", "@/lib/auth/server", false],
    ["lib/auth/server.ts", "@/lib/jobs/enqueue", true],
    ["lib/auth/session.ts", "@/lib/use-cases/run", false],
    ["lib/use-cases/people.ts", "@/lib/auth/session", true],
    ["lib/use-cases/people.ts", "@/components/ui/button", false],
    ["components/x.tsx", "@/lib/domain/action-state", true],
    ["components/x.tsx", "@/lib/use-cases/run", false],
    ["app/(app)/x/page.tsx", "@/lib/use-cases/run", true],
    ["app/(app)/x/page.tsx", "@/lib/data/users", false],
    ["app/(app)/x/page.tsx", "@/lib/jobs/enqueue", false],
    ["app/(app)/x/page.tsx", "@/db/schema", false],
    ["proxy.ts", "@/lib/use-cases/health", true],
    ["proxy.ts", "@/lib/server-env", true],
    ["proxy.ts", "@/lib/data/health", false],
    ["proxy.ts", "@/lib/auth/session", false],
    ["app/(app)/x/page.tsx", "@/proxy", false],
  ];
  it.each(CASES)("%s importing %s: allowed %s", async (filePath, specifier, allowed) => {
    const messages = await restrictedImports(filePath, `import * as m from "${specifier}";\nexport const x = m;`);
    if (allowed) expect(messages).toEqual([]);
    else expect(messages).not.toEqual([]);
  });

  it("lets pages import DTO types, not values, from lib/data", async () => {
    expect(
      await restrictedImports(
        "app/(app)/x/page.tsx",
        'import type { UserDto } from "@/lib/data/users";\nexport type X = UserDto;',
      ),
    ).toEqual([]);
    expect(
      await restrictedImports(
        "app/(app)/x/page.tsx",
        'import { listUsers } from "@/lib/data/users";\nexport const x = listUsers;',
      ),
    ).not.toEqual([]);
  });

  it("refuses a relative import that climbs out of a layer", async () => {
    expect(
      await restrictedImports("lib/data/users.ts", 'import { auth } from "../auth/server";\nexport const x = auth;'),
    ).not.toEqual([]);
    expect(
      await restrictedImports("lib/domain/schemas/users.ts", 'import { ROLES } from "../roles";\nexport const x = ROLES;'),
    ).toEqual([]);
    expect(
      await restrictedImports("lib/domain/schemas/users.ts", 'import { db } from "../../data/users";\nexport const x = db;'),
    ).not.toEqual([]);
  });
});

describe("the whole tree", () => {
  // The rules above only help if the real files obey them; CI runs this, so a violation cannot land.
  it("passes ESLint with no errors", async () => {
    const results = await eslint.lintFiles(["."]);
    const errors = results.flatMap((r) =>
      r.messages
        .filter((m) => m.severity === 2)
        .map((m) => `${r.filePath.slice(process.cwd().length + 1)}:${m.line} ${m.ruleId ?? ""} ${m.message}`),
    );
    expect(errors).toEqual([]);
  }, 120_000);
});
