// Why a session ended, for the sign-in page: a deactivated person's browser still holds the ended
// session's cookie, and is told "This account has been deactivated" rather than shown a plain form.
// Only a hash of the token is kept; a reactivated account's old cookie is simply signed out.
import { describe, expect, it } from "vitest";
import { pool } from "@/db";
import { getSessionEndReason } from "@/lib/auth/session";
import { hashSessionToken } from "@/lib/data/sessions";
import { deactivateUser, reactivateUser } from "@/lib/use-cases/people";
import { runUseCase } from "@/lib/use-cases/run";
import { createTestUser, signInHeaders } from "./helpers/people";
import { GET as getMe } from "@/app/api/me/route";

const meWith = (headers: Headers) => getMe(new Request("http://127.0.0.1/api/me", { headers }), { params: Promise.resolve({}) });

describe("why a session ended", () => {
  it("names deactivation for the browser that held the session, until the account is reactivated", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor, password } = await createTestUser({ role: "engineer", label: "leaver" });
    const headers = await signInHeaders(actor.email, password);
    expect(await getSessionEndReason(headers)).toBeNull();

    await runUseCase(deactivateUser, { actor: admin, input: { userId: actor.id } });
    expect(await getSessionEndReason(headers)).toBe("deactivated");

    // The token itself is not stored: only its hash.
    const token = decodeURIComponent(headers.get("cookie")!.split("=")[1]).split(".")[0];
    const { rows } = await pool.query("select token_hash, reason from ended_session where user_id = $1", [actor.id]);
    expect(rows).toEqual([{ token_hash: hashSessionToken(token), reason: "deactivated" }]);
    expect(JSON.stringify(rows)).not.toContain(token);

    await runUseCase(reactivateUser, { actor: admin, input: { userId: actor.id } });
    expect(await getSessionEndReason(headers)).toBeNull();
  });

  it("says nothing for no cookie, a made-up one, or a plain sign-out", async () => {
    expect(await getSessionEndReason(new Headers())).toBeNull();
    expect(await getSessionEndReason(new Headers({ cookie: "better-auth.session_token=made-up.signature" }))).toBeNull();
    const { actor, password } = await createTestUser({ role: "auditor" });
    const headers = await signInHeaders(actor.email, password);
    await pool.query("delete from session where user_id = $1", [actor.id]);
    expect(await getSessionEndReason(headers)).toBeNull();
  });

  it("GET /api/me answers 401 with the reason, so the open page can say it though this answer clears the cookie", async () => {
    const { actor: admin } = await createTestUser({ role: "admin" });
    const { actor, password } = await createTestUser({ role: "lead", label: "mover" });
    const headers = await signInHeaders(actor.email, password);
    expect((await meWith(headers)).status).toBe(200);

    await runUseCase(deactivateUser, { actor: admin, input: { userId: actor.id } });
    const refused = await meWith(headers);
    expect(refused.status).toBe(401);
    expect(await refused.json()).toMatchObject({ reason: "deactivated" });

    // No cookie, no reason: the plain 401.
    const anonymous = await meWith(new Headers());
    expect(anonymous.status).toBe(401);
    expect(await anonymous.json()).not.toHaveProperty("reason");
  });
});
