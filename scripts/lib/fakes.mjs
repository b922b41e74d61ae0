// Starts the fake SMTP and fake S3 as children of the set-up script, or reuses ours when they answer.
import fs from "node:fs";
import path from "node:path";
import { repoRoot } from "./env.mjs";
import { SetupError, httpGet, portAnswers, say, spawnService, stopChild, waitFor } from "./processes.mjs";

async function fakeSmtpAnswers(apiPort) {
  const answer = await httpGet(`http://127.0.0.1:${apiPort}/health`);
  return answer?.status === 200 && answer.body.includes("gusset-fake-smtp");
}

async function fakeS3Answers(port) {
  const answer = await httpGet(`http://127.0.0.1:${port}/`);
  return answer !== null && answer.body.includes("<?xml");
}

function startNodeService(name, script, args, { layout, profile, registry }) {
  const logFile = path.join(layout.logs, `${name}-${profile}.log`);
  const child = spawnService(process.execPath, [path.join("scripts", script), ...args, "--parent-pid", String(process.pid)], {
    cwd: repoRoot,
    env: process.env,
    logFile,
  });
  registry.add(name, () => stopChild(child));
  return { child, logFile };
}

export async function ensureFakeSmtp({ ports, layout, profile, registry }) {
  if (await fakeSmtpAnswers(ports.mailApi)) {
    say(`fake SMTP already answers on ${ports.smtp} (API ${ports.mailApi}): reusing it`);
    return;
  }
  for (const port of [ports.smtp, ports.mailApi]) {
    if (await portAnswers(port)) throw new SetupError(`port ${port} (fake SMTP) is busy with something else`);
  }
  const { child, logFile } = startNodeService(
    "fake-smtp",
    "fake-smtp.mjs",
    ["--smtp-port", String(ports.smtp), "--api-port", String(ports.mailApi)],
    { layout, profile, registry },
  );
  await waitFor("fake SMTP", () => fakeSmtpAnswers(ports.mailApi), { child, logFile, timeoutMs: 20_000 });
  say(`fake SMTP on 127.0.0.1:${ports.smtp}, mailbox API http://127.0.0.1:${ports.mailApi}/messages`);
}

export async function ensureFakeS3({ ports, layout, profile, registry, bucket }) {
  if (await fakeS3Answers(ports.s3)) {
    say(`fake S3 already answers on ${ports.s3}: reusing it`);
    return;
  }
  if (await portAnswers(ports.s3)) throw new SetupError(`port ${ports.s3} (fake S3) is busy with something else`);
  fs.mkdirSync(layout.s3, { recursive: true });
  const { child, logFile } = startNodeService(
    "fake-s3",
    "fake-s3.mjs",
    ["--port", String(ports.s3), "--directory", layout.s3, "--bucket", bucket],
    { layout, profile, registry },
  );
  await waitFor("fake S3", () => fakeS3Answers(ports.s3), { child, logFile, timeoutMs: 20_000 });
  say(`fake S3 on http://127.0.0.1:${ports.s3} (bucket ${bucket})`);
}
