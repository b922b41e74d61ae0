// The local services `npm test` starts really work: PostgreSQL on DATABASE_URL, the fake SMTP with its
// mailbox API, and the fake S3 with the client settings the app uses.
import crypto from "node:crypto";
import { Readable } from "node:stream";
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import nodemailer from "nodemailer";
import pg from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { testEnv } from "../support/env";
import { listMessages, waitForMessage } from "../support/mailbox";

describe("PostgreSQL", () => {
  it("answers select 1 on DATABASE_URL", async () => {
    const client = new pg.Client({ connectionString: testEnv.databaseUrl });
    await client.connect();
    try {
      const result = await client.query("select 1 as one, current_database() as db");
      expect(result.rows[0]).toEqual({ one: 1, db: new URL(testEnv.databaseUrl).pathname.slice(1) });
    } finally {
      await client.end();
    }
  });
});

describe("fake SMTP", () => {
  it("receives a message sent by nodemailer and lists it through the API", async () => {
    const transport = nodemailer.createTransport({
      host: testEnv.smtp.host,
      port: testEnv.smtp.port,
      secure: false,
      ignoreTLS: true,
    });
    const tag = crypto.randomUUID();
    const to = `infra-${tag.slice(0, 8)}@gusset.example`;
    await transport.sendMail({
      from: testEnv.mailFrom,
      to,
      subject: `Infra check ${tag}`,
      text: `Plain body ${tag} https://gusset.example/check`,
      html: `<p>HTML body ${tag}</p>`,
    });

    const message = await waitForMessage({ to, subjectIncludes: tag, timeoutMs: 5000 });
    expect(message.to).toEqual([to]);
    expect(message.from).toContain("no-reply@gusset.example");
    expect(message.text).toContain(`Plain body ${tag}`);
    expect(message.html).toContain(`HTML body ${tag}`);
    expect(Number.isNaN(Date.parse(message.date))).toBe(false);
    // Newest first. Other mail may arrive meanwhile (the worker's sealer e-mails the QA witness every new tree head, and
    // other test files send mail at the same time), so the list is checked for its order, not for this message on top.
    const ids = (await listMessages()).map((listed) => Number(listed.id));
    expect(ids).toContain(Number(message.id));
    expect(ids).toEqual([...ids].sort((a, b) => b - a));

    const one = await fetch(new URL(`/messages/${message.id}`, testEnv.mailApiUrl));
    expect(one.status).toBe(200);
    expect(((await one.json()) as { subject: string }).subject).toBe(message.subject);
  });
});

describe("fake S3", () => {
  const s3 = new S3Client({
    endpoint: testEnv.s3.endpoint,
    region: testEnv.s3.region,
    forcePathStyle: true,
    credentials: { accessKeyId: testEnv.s3.accessKeyId, secretAccessKey: testEnv.s3.secretAccessKey },
    // Without these two a streamed upload is stored with extra bytes and no error.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  const keys: string[] = [];
  afterAll(async () => {
    for (const Key of keys) await s3.send(new DeleteObjectCommand({ Bucket: testEnv.s3.bucket, Key }));
    s3.destroy();
  });

  async function roundTrip(body: Buffer, makeBody: () => Buffer | Readable): Promise<Buffer> {
    const Key = `infra-checks/${crypto.randomUUID()}.bin`;
    keys.push(Key);
    await s3.send(
      new PutObjectCommand({
        Bucket: testEnv.s3.bucket,
        Key,
        Body: makeBody(),
        ContentLength: body.length,
        ContentType: "application/octet-stream",
      }),
    );
    const got = await s3.send(new GetObjectCommand({ Bucket: testEnv.s3.bucket, Key }));
    return Buffer.from(await got.Body!.transformToByteArray());
  }

  const sha256 = (data: Buffer) => crypto.createHash("sha256").update(data).digest("hex");

  it("stores and returns a buffer byte for byte", async () => {
    const body = crypto.randomBytes(64 * 1024);
    expect(sha256(await roundTrip(body, () => body))).toBe(sha256(body));
  });

  it("stores and returns a streamed upload byte for byte", async () => {
    const body = crypto.randomBytes(200 * 1024);
    expect(sha256(await roundTrip(body, () => Readable.from([body.subarray(0, 1000), body.subarray(1000)])))).toBe(sha256(body));
  });
});
