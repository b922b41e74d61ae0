// The log's tree heads and leaf entries: the signed text is exactly the four documented lines; a signature made
// here verifies with a standard Ed25519 verifier outside Node (OpenSSL's pkeyutl -rawin, when the machine has
// openssl) and fails for any changed field; the RFC 8032 §7.1 TEST 1 key pair (from memory, checked below by
// deriving its public key) signs as the RFC says; leaf entries are canonical JSON (RFC 8785) and refuse bad fields.
import { execFileSync } from "node:child_process";
import { createPrivateKey, createPublicKey, sign } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  generateLogKeyPair,
  leafEntryBytes,
  publicKeyFingerprint,
  signTreeHead,
  treeHeadDigest,
  treeHeadText,
  verifyTreeHead,
} from "@/lib/integrity/tree-head";

const head = {
  size: 1234,
  rootHash: "5dc9da79a70659a9ad559cb701ded9a2ab9d823aad2f4960cfe370eff4604328",
  sealedAt: "2026-12-02T23:20:00.000Z",
};

function hasOpenssl(): boolean {
  try {
    execFileSync("openssl", ["version"], { stdio: "ignore" });
    return true;
  } catch {
    return false;
  }
}

describe("tree heads", () => {
  it("signs the four documented lines", () => {
    expect(treeHeadText(head)).toBe(`gusset-tree-head/1\n1234\n${head.rootHash}\n2026-12-02T23:20:00.000Z\n`);
    // sha256 of that text, computed independently of treeHeadDigest.
    const expected = execFileSync("sha256sum", { input: treeHeadText(head) })
      .toString()
      .split(" ")[0];
    expect(treeHeadDigest(head)).toBe(expected);
  });

  it("verifies its own signature and refuses any changed field, signature or key", () => {
    const { privateKeyPem, publicKeyPem } = generateLogKeyPair();
    const signature = signTreeHead(head, privateKeyPem);
    expect(verifyTreeHead(head, signature, publicKeyPem)).toBe(true);
    expect(verifyTreeHead({ ...head, size: 1235 }, signature, publicKeyPem)).toBe(false);
    expect(verifyTreeHead({ ...head, rootHash: `${head.rootHash.slice(0, 63)}9` }, signature, publicKeyPem)).toBe(false);
    expect(verifyTreeHead({ ...head, sealedAt: "2026-12-02T23:20:00.001Z" }, signature, publicKeyPem)).toBe(false);
    const flipped = Buffer.from(signature, "base64");
    flipped[10] ^= 1;
    expect(verifyTreeHead(head, flipped.toString("base64"), publicKeyPem)).toBe(false);
    expect(verifyTreeHead(head, "c2hvcnQ=", publicKeyPem)).toBe(false);
    expect(verifyTreeHead(head, signature, generateLogKeyPair().publicKeyPem)).toBe(false);
    expect(publicKeyFingerprint(publicKeyPem)).toMatch(/^[0-9a-f]{64}$/);
  });

  it.runIf(hasOpenssl())("makes signatures a standard Ed25519 verifier (OpenSSL) accepts", () => {
    const { privateKeyPem, publicKeyPem } = generateLogKeyPair();
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "gusset-head-"));
    try {
      fs.writeFileSync(path.join(dir, "head.txt"), treeHeadText(head));
      fs.writeFileSync(path.join(dir, "head.sig"), Buffer.from(signTreeHead(head, privateKeyPem), "base64"));
      fs.writeFileSync(path.join(dir, "log.pub"), publicKeyPem);
      const verified = execFileSync(
        "openssl",
        ["pkeyutl", "-verify", "-pubin", "-inkey", "log.pub", "-rawin", "-in", "head.txt", "-sigfile", "head.sig"],
        { cwd: dir },
      ).toString();
      expect(verified).toMatch(/Signature Verified Successfully/);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it("signs as RFC 8032 §7.1 TEST 1 says (from memory; the public key is derived, not copied)", () => {
    const secret = "9d61b19deffd5a60ba844af492ec2cc44449c5697b326919703bac031cae7f60";
    const privateKey = createPrivateKey({
      key: Buffer.from(`302e020100300506032b657004220420${secret}`, "hex"),
      format: "der",
      type: "pkcs8",
    });
    const raw = createPublicKey(privateKey).export({ type: "spki", format: "der" }).subarray(12).toString("hex");
    expect(raw).toBe("d75a980182b10ab7d54bfed3c964073a0ee172f3daa62325af021a68f707511a");
    expect(sign(null, Buffer.alloc(0), privateKey).toString("hex")).toBe(
      "e5564300c360ac729086e2cc806e828a84877f1eb8e5d974d873e065224901555fb8821590a33bacc61e39701cf9b46bd25bf5f0595bbe24655141438e7a100b",
    );
  });

  it("refuses a head it cannot write exactly", () => {
    expect(() => treeHeadText({ ...head, size: -1 })).toThrow(/size must be a whole number/);
    expect(() => treeHeadText({ ...head, rootHash: "ABC" })).toThrow(/rootHash must be 64 lowercase hex digits/);
    expect(() => treeHeadText({ ...head, sealedAt: "2026-12-02 23:20" })).toThrow(/sealedAt must be ISO 8601/);
  });
});

describe("leaf entries", () => {
  const entry = {
    kind: "run",
    ref: "a6a43c8b-576b-41ad-8189-225fd2578526",
    sha256: head.rootHash,
    at: "2026-12-02T22:12:00.000Z",
  } as const;

  it("are the entry's canonical JSON, keys sorted, whatever order they were given in", () => {
    const text = new TextDecoder().decode(leafEntryBytes({ at: entry.at, sha256: entry.sha256, ref: entry.ref, kind: "run" }));
    expect(text).toBe(`{"at":"${entry.at}","kind":"run","ref":"${entry.ref}","sha256":"${entry.sha256}"}`);
  });

  it("refuse an unknown kind, an empty ref, a malformed hash or time", () => {
    expect(() => leafEntryBytes({ ...entry, kind: "note" as never })).toThrow(/unknown kind "note"/);
    expect(() => leafEntryBytes({ ...entry, ref: "" })).toThrow(/names no row/);
    expect(() => leafEntryBytes({ ...entry, sha256: "00" })).toThrow(/sha256 must be 64 lowercase hex/);
    expect(() => leafEntryBytes({ ...entry, at: "yesterday" })).toThrow(/at must be ISO 8601/);
  });
});
