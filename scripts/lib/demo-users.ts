// Prints the demo firm and its sign-ins from db/demo-users.ts as one JSON line, for the set-up scripts.
// The path is computed so this file type-checks before db/demo-users.ts exists.
import path from "node:path";
import { pathToFileURL } from "node:url";

type DemoUser = { name: string; email: string; password: string; role: string };

const file = path.resolve(import.meta.dirname, "..", "..", "db", "demo-users.ts");
const demo = (await import(pathToFileURL(file).href)) as { DEMO_USERS: DemoUser[]; DEMO_FIRM_NAME?: string };
const users = demo.DEMO_USERS.map(({ name, email, password, role }) => ({ name, email, password, role }));
console.log(JSON.stringify({ firm: demo.DEMO_FIRM_NAME ?? null, users }));
