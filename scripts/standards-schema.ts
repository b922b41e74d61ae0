/**
 * npm run standards:schema — writes content/standard.schema.json, the JSON Schema of a standard's definition
 * (the YAML header), for editors and other tools. A test fails when the committed file is out of date.
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import { definitionJsonSchema } from "../lib/standards";

const file = path.resolve(import.meta.dirname, "../content/standard.schema.json");
writeFileSync(file, `${JSON.stringify(definitionJsonSchema(), null, 2)}\n`);
console.log(`wrote ${path.relative(process.cwd(), file)}`);
