/** The firm's starting standards: every version file under content/standards, by path. */
import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import type { AttachmentType } from "@/db/schema";
import type { VerificationResult } from "@/lib/standards/verify";

export const STANDARDS_DIR = path.resolve(import.meta.dirname, "../../content/standards");

export function startingStandardFiles(): { file: string; source: string }[] {
  return readdirSync(STANDARDS_DIR, { recursive: true, encoding: "utf8" })
    .filter((f) => f.endsWith(".mdx"))
    .sort()
    .map((file) => ({ file, source: readFileSync(path.join(STANDARDS_DIR, file), "utf8") }));
}

/** The files a version's cases cite, read from the standard's folder; each must have the sha256 cited. */
export function citedHandCalculations(slug: string, check: { verification: ReadonlyArray<VerificationResult> }) {
  return check.verification.flatMap((result) => {
    if (!result.handCalculation) return [];
    const { file, sha256 } = result.handCalculation;
    const where = path.join(STANDARDS_DIR, slug, "hand-calculations", file);
    if (!existsSync(where))
      throw new Error(`content/standards/${slug}: the case “${result.name}” cites hand-calculations/${file}, which is not there`);
    const body = new Uint8Array(readFileSync(where));
    const actual = createHash("sha256").update(body).digest("hex");
    if (actual !== sha256)
      throw new Error(
        `content/standards/${slug}/hand-calculations/${file} has sha256 ${actual}, not the ${sha256} the case cites`,
      );
    const contentType = CONTENT_TYPES[path.extname(file).toLowerCase()];
    if (!contentType)
      throw new Error(`content/standards/${slug}/hand-calculations/${file}: a hand calculation is a PDF, PNG or JPEG`);
    return [{ file, sha256, body, contentType }];
  });
}

const CONTENT_TYPES: Record<string, AttachmentType> = {
  ".pdf": "application/pdf",
  ".png": "image/png",
  ".jpg": "image/jpeg",
  ".jpeg": "image/jpeg",
};
