// The settings module: parsed once with zod, defaults for the local set-up, and a refusal that names
// every bad variable instead of a wrong default surfacing later.
import { afterEach, describe, expect, it } from "vitest";
import { forgetServerEnv, requireSetting, serverEnv } from "@/lib/server-env";

const saved = { ...process.env };

afterEach(() => {
  for (const key of Object.keys(process.env)) if (!(key in saved)) delete process.env[key];
  Object.assign(process.env, saved);
  forgetServerEnv();
});

function withEnv(values: Record<string, string | undefined>) {
  for (const [key, value] of Object.entries(values)) {
    if (value === undefined) delete process.env[key];
    else process.env[key] = value;
  }
  forgetServerEnv();
}

describe("serverEnv()", () => {
  it("fills the local defaults when a setting is absent", () => {
    withEnv({
      SMTP_HOST: undefined,
      SMTP_PORT: undefined,
      MAIL_FROM: undefined,
      GUSSET_SIGN_IN_RATE_LIMIT_MAX: undefined,
      BETTER_AUTH_URL: undefined,
    });
    const env = serverEnv();
    expect(env.SMTP_HOST).toBe("127.0.0.1");
    expect(env.SMTP_PORT).toBe(2525);
    expect(env.MAIL_FROM).toBe("Gusset <no-reply@gusset.example>");
    expect(env.GUSSET_SIGN_IN_RATE_LIMIT_MAX).toBe(5);
    expect(env.BETTER_AUTH_URL).toBe("http://127.0.0.1:3000");
  });

  it("reads numbers and lists", () => {
    withEnv({ SMTP_PORT: "2526", GUSSET_TRUSTED_PROXIES: " 10.0.0.1, ,10.0.0.2 ", GUSSET_SIGN_IN_RATE_LIMIT_MAX: "12" });
    expect(serverEnv().SMTP_PORT).toBe(2526);
    expect(serverEnv().GUSSET_TRUSTED_PROXIES).toEqual(["10.0.0.1", "10.0.0.2"]);
    expect(serverEnv().GUSSET_SIGN_IN_RATE_LIMIT_MAX).toBe(12);
  });

  it("is parsed once: a later change to process.env is not seen until forgotten", () => {
    withEnv({ MAIL_FROM: "First <first@x.example>" });
    expect(serverEnv().MAIL_FROM).toBe("First <first@x.example>");
    process.env.MAIL_FROM = "Second <second@x.example>";
    expect(serverEnv().MAIL_FROM).toBe("First <first@x.example>");
    forgetServerEnv();
    expect(serverEnv().MAIL_FROM).toBe("Second <second@x.example>");
  });

  it("refuses bad values, naming each one", () => {
    withEnv({ SMTP_PORT: "twenty-five", BETTER_AUTH_SECRET: "short", BETTER_AUTH_URL: "not a url" });
    expect(() => serverEnv()).toThrowError("Gusset's settings are not valid");
    expect(() => serverEnv()).toThrowError('SMTP_PORT: expected a positive whole number, got "twenty-five"');
    expect(() => serverEnv()).toThrowError("BETTER_AUTH_SECRET: must be at least 32 characters");
    expect(() => serverEnv()).toThrowError("BETTER_AUTH_URL: must be a URL such as http://127.0.0.1:3000");
  });

  it("requireSetting names a missing setting", () => {
    withEnv({ S3_BUCKET: undefined });
    expect(() => requireSetting("S3_BUCKET")).toThrowError("S3_BUCKET is not set (npm start and npm test set it).");
    withEnv({ S3_BUCKET: "gusset" });
    expect(requireSetting("S3_BUCKET")).toBe("gusset");
  });
});
