// Attachments in Chromium: an engineer opens a demo job, attaches a small PNG (made here, so each run's bytes are new)
// with a note, reads its sha256 on the job's page, and downloads it as the same bytes with the same sha256. A text
// file renamed to .png is refused by the server (the type is told from the bytes, not the name), the message shown
// beside the form, and nothing is listed or stored for it.
import { createHash, randomBytes } from "node:crypto";
import fs from "node:fs";
import { deflateSync } from "node:zlib";
import { eq } from "drizzle-orm";
import { expect, it } from "vitest";
import { db } from "@/db";
import * as schema from "@/db/schema";
import { useBrowser, usePagesAs } from "../support/browser";
import { appUrl } from "../support/env";
import { demoSession, journeyTimeout } from "../support/pages";

const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/** CRC-32 of a PNG chunk (ISO/IEC 15948, PNG 2nd ed., Annex D: polynomial 0xEDB88320, reflected). */
function crc32(bytes: Uint8Array): number {
  let crc = 0xffffffff;
  for (const byte of bytes) {
    crc ^= byte;
    for (let bit = 0; bit < 8; bit++) crc = crc & 1 ? (crc >>> 1) ^ 0xedb88320 : crc >>> 1;
  }
  return (crc ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A real 4 × 4 RGB PNG of random colours: signature, IHDR, one IDAT (each row led by filter type 0), IEND. */
function smallPng(): Buffer {
  const [width, height] = [4, 4];
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header.set([8, 2, 0, 0, 0], 8); // 8 bits per sample, truecolour, deflate, adaptive filtering, no interlace
  const rows = Buffer.concat(Array.from({ length: height }, () => Buffer.concat([Buffer.from([0]), randomBytes(width * 3)])));
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", header),
    chunk("IDAT", deflateSync(rows)),
    chunk("IEND", new Uint8Array()),
  ]);
}

const pageAs = usePagesAs(useBrowser());

it(
  "an engineer attaches a PNG to a job, reads its sha256 and downloads the same bytes; a renamed text file is refused",
  async () => {
    const page = await pageAs(await demoSession("engineer"));
    const jobNumber = "MF-2291";
    await page.goto(appUrl(`/jobs/${jobNumber}`));
    const section = page.getByTestId("attachments");
    await section.waitFor();

    const photo = smallPng();
    const photoSha256 = sha256(photo);
    const fileName = `gable-${Date.now().toString(36)}.png`;
    await section.getByTestId("attach-file").setInputFiles({ name: fileName, mimeType: "image/png", buffer: photo });
    await section.getByTestId("attach-note").fill("Site photo, north gable");
    await section.getByTestId("attach-submit").click();
    await expect.poll(() => section.getByTestId("attach-done").textContent(), { timeout: 15_000 }).toContain(fileName);
    expect(await section.getByTestId("attach-done").textContent()).toContain(`sha256 ${photoSha256.slice(0, 12)}`);

    // The page refreshes into the list: the file with its note and its full sha256, as the server computed it.
    const listed = section.locator(`[data-testid=attachment][data-sha256="${photoSha256}"]`);
    await listed.waitFor({ timeout: 15_000 });
    expect(await listed.textContent()).toContain("Site photo, north gable");
    expect(await listed.textContent()).toContain(`sha256 ${photoSha256}`);
    await page.reload();
    await listed.waitFor();

    // Downloaded through the same permission checks: the same bytes, the same sha256, under its own name.
    const [download] = await Promise.all([page.waitForEvent("download", { timeout: 30_000 }), listed.getByRole("link").click()]);
    const downloaded = new Uint8Array(fs.readFileSync((await download.path())!));
    expect(download.suggestedFilename()).toBe(fileName);
    expect(Buffer.from(downloaded).equals(photo)).toBe(true);
    expect(sha256(downloaded)).toBe(photoSha256);

    // A text file renamed to .png: the browser calls it a PNG, the server reads the bytes and refuses it.
    const listedBefore = await section.getByTestId("attachment").count();
    const fake = Buffer.from(`Loads for grid B, not an image (${Date.now()})\n`, "utf8");
    const fakeName = `loads-${Date.now().toString(36)}.png`;
    await section.getByTestId("attach-file").setInputFiles({ name: fakeName, mimeType: "image/png", buffer: fake });
    await section.getByTestId("attach-note").fill("Renamed text file");
    await section.getByTestId("attach-submit").click();
    const refusal = section.getByTestId("form-error");
    await expect
      .poll(() => refusal.textContent(), { timeout: 15_000 })
      .toBe("The file's contents do not match its type; export it again as PDF, PNG, JPEG or WebP.");
    expect(await section.getByTestId("attach-done").count()).toBe(0);
    // Beside the form: the message follows the form inside the attachments section.
    expect(
      await section.evaluate((element) => {
        const form = element.querySelector("[data-testid=attach-form]");
        const error = element.querySelector("[data-testid=form-error]");
        return Boolean(form && error && form.compareDocumentPosition(error) & Node.DOCUMENT_POSITION_FOLLOWING);
      }),
    ).toBe(true);
    await page.reload();
    await section.waitFor();
    expect(await section.getByTestId("attachment").count()).toBe(listedBefore);
    expect(await section.getByText(fakeName).count()).toBe(0);
    expect(
      await db
        .select()
        .from(schema.jobAttachments)
        .where(eq(schema.jobAttachments.sha256, sha256(fake))),
      "no row is kept for the refused file",
    ).toEqual([]);
  },
  journeyTimeout(1, 60_000),
);
