import "server-only";
// Hand calculations attached to a standard: the files its verification cases cite by sha256 when the expected
// values were worked out by hand by a named checker. A file is stored in S3 under its sha256 before the
// transaction opens (nothing slow inside one), then recorded against the standard; the record is append-only,
// so the evidence a published version cites never goes. Anyone who reads standards may download a file that
// some standard has attached; nothing else in the bucket is reachable this way.
import { createHash } from "node:crypto";
import { AppError } from "@/lib/domain/errors";
import { TYPE_EXTENSIONS, TYPE_WORDS, bytesAreOfType, cleanFileName } from "@/lib/domain/file-signatures";
import { attachHandCalculationSchema, handCalculationRefSchema } from "@/lib/domain/schemas/standards";
import type { AttachmentType } from "@/db/schema";
import { getAttachment, getDraft, getSlugOf, insertAttachment, listAttachments, type AttachmentDto } from "@/lib/data/standards";
import { getObject, putObject } from "@/lib/storage/s3";
import type { SourceCheck } from "./standard-gate";
import { NOT_THE_AUTHOR, ownEditableDraft } from "./draft-access";
import { defineUseCase } from "./use-case";

/** The S3 key of a hand calculation: content-addressed, so the same bytes are stored once. */
export const handCalculationKey = (sha256: string) => `standards/hand-calculations/${sha256}`;

export const attachHandCalculation = defineUseCase({
  name: "standards.attachment.add",
  permission: "templates.write-draft",
  input: attachHandCalculationSchema,
  prepare: async ({ draftId, file }, { actor }) => {
    // Checked again under the draft's lock in `run`; asked here so nobody else's upload reaches the bucket.
    const draft = await getDraft(draftId);
    if (!draft) throw new AppError("not-found", "That draft does not exist.");
    if (draft.authorId !== actor.id) throw new AppError("forbidden", NOT_THE_AUTHOR);
    const contentType = file.type as AttachmentType;
    const body = new Uint8Array(await file.arrayBuffer());
    if (!bytesAreOfType(body, contentType))
      throw new AppError("invalid-input", `That file is not a ${TYPE_WORDS[contentType]} file, whatever its name says.`, {
        fieldErrors: { file: ["The file's contents do not match its type; export it again as PDF, PNG or JPEG."] },
      });
    const sha256 = createHash("sha256").update(body).digest("hex");
    await putObject({ key: handCalculationKey(sha256), body, contentType });
    return {
      sha256,
      contentType,
      bytes: body.length,
      fileName: cleanFileName(file.name, `hand-calculation.${TYPE_EXTENSIONS[contentType]}`),
    };
  },
  run: async ({ draftId }, { actor, prepared }) => {
    const draft = await ownEditableDraft(draftId, actor);
    const { added } = await insertAttachment({ standardId: draft.standardId, uploadedById: actor.id, ...prepared });
    return { ...prepared, added, slug: await getSlugOf(draft.standardId) };
  },
  audit: ({ result }) =>
    result.added
      ? {
          action: "standards.attachment.add",
          subject: null,
          details: { slug: result.slug, sha256: result.sha256, fileName: result.fileName, bytes: result.bytes },
        }
      : null,
});

/** An attached hand calculation's bytes, for download. */
export const readHandCalculation = defineUseCase({
  name: "standards.attachment.read",
  permission: "library.read",
  input: handCalculationRefSchema,
  prepare: async ({ sha256 }) => {
    const object = await getObject({ key: handCalculationKey(sha256) });
    return object ? { body: object.body } : null;
  },
  run: async ({ sha256 }, { prepared }) => {
    const attachment = await getAttachment(sha256);
    if (!attachment || !prepared)
      throw new AppError("not-found", "No hand calculation with that sha256 is attached to a standard.");
    return { ...attachment, sha256, body: prepared.body };
  },
  audit: null,
});

/**
 * Refusals for verification cases citing a hand calculation that is not attached to the standard (or attached
 * with other bytes): submitting and publishing need the evidence in place.
 */
export async function missingHandCalculations(standardId: string, check: SourceCheck): Promise<string[]> {
  const cited = check.verification.flatMap((result) =>
    result.handCalculation ? [{ name: result.name, ...result.handCalculation }] : [],
  );
  if (cited.length === 0) return [];
  const attached = new Set((await listAttachments(standardId)).map((a: AttachmentDto) => a.sha256));
  return cited
    .filter((c) => !attached.has(c.sha256))
    .map(
      (c) =>
        `Verification case “${c.name}” cites the hand calculation ${c.file} by ${c.checker} (sha256 ${c.sha256.slice(0, 12)}…), but no file with that sha256 is attached to this standard: attach it on the draft page.`,
    );
}
