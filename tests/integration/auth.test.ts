import { eq } from "drizzle-orm";
import { beforeEach, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { listAuditByAction } from "@/db/queries/audit";
import { getActiveSessionUser } from "@/db/queries/users";
import { authTokens, outbox, users } from "@/db/schema";
import { THROTTLE, verifyCredentials } from "@/lib/auth/credentials";
import { inviteUser, requestPasswordReset, setPasswordWithToken, updateUser } from "@/lib/users/service";
import { makeUser, resetDb } from "./db-helpers";

beforeEach(resetDb);

describe("sign-in", () => {
  it("accepts the right password and refuses a wrong one, auditing both", async () => {
    const u = await makeUser("examiner");
    const ok = await verifyCredentials(db(), u.email, u.password, "10.0.0.1");
    expect(ok).toMatchObject({ ok: true, user: { id: u.id, role: "examiner" } });
    const bad = await verifyCredentials(db(), u.email, "wrong password!", "10.0.0.1");
    expect(bad).toEqual({ ok: false, reason: "invalid" });
    const unknown = await verifyCredentials(db(), "nobody@test.example", "whatever", "10.0.0.1");
    expect(unknown).toEqual({ ok: false, reason: "invalid" });
    expect(await listAuditByAction(db(), "auth.sign_in")).toHaveLength(1);
    expect(await listAuditByAction(db(), "auth.sign_in_failed")).toHaveLength(2);
  });

  it("refuses a deactivated account even with the right password", async () => {
    const u = await makeUser("applicant");
    await db().update(users).set({ status: "deactivated" }).where(eq(users.id, u.id));
    expect(await verifyCredentials(db(), u.email, u.password, "local")).toEqual({ ok: false, reason: "invalid" });
  });

  it("throttles an account after repeated failures, even with the right password", async () => {
    const u = await makeUser("applicant");
    for (let i = 0; i < THROTTLE.perAccount; i++) await verifyCredentials(db(), u.email, "nope nope nope", `10.0.1.${i}`);
    expect(await verifyCredentials(db(), u.email, u.password, "10.0.9.9")).toEqual({ ok: false, reason: "throttled" });
    expect(await listAuditByAction(db(), "auth.sign_in_throttled")).toHaveLength(1);
  });

  it("throttles an address that tries many accounts", async () => {
    for (let i = 0; i < THROTTLE.perAddress; i++) await verifyCredentials(db(), `guess${i}@test.example`, "x", "10.7.7.7");
    const u = await makeUser("applicant");
    expect(await verifyCredentials(db(), u.email, u.password, "10.7.7.7")).toEqual({ ok: false, reason: "throttled" });
    expect((await verifyCredentials(db(), u.email, u.password, "10.7.7.8")).ok).toBe(true);
  });
});

describe("invitation, reset and session revocation", () => {
  it("invites: user, one-time token, e-mail and audit in one go; the link sets the password once", async () => {
    const admin = await makeUser("admin");
    const { id } = await inviteUser(db(), admin, { email: "new.examiner@test.example", name: "Nia Brook", role: "examiner" });
    const [mail] = await db().select().from(outbox).where(eq(outbox.toAddress, "new.examiner@test.example"));
    expect(mail?.subject).toContain("Spanproof account");
    const token = mail!.textBody.match(/\/invite\/([A-Za-z0-9_-]{43})/)?.[1];
    expect(token).toBeDefined();
    const [stored] = await db().select().from(authTokens).where(eq(authTokens.userId, id));
    expect(stored?.tokenHash).not.toContain(token!);

    expect((await verifyCredentials(db(), "new.examiner@test.example", "a brand new password", "local")).ok).toBe(false);
    await setPasswordWithToken(db(), "invite", token!, "a brand new password");
    expect((await verifyCredentials(db(), "new.examiner@test.example", "a brand new password", "local")).ok).toBe(true);
    await expect(setPasswordWithToken(db(), "invite", token!, "another password 123")).rejects.toThrow(/expired or was already used/);
    expect(await listAuditByAction(db(), "user.invited")).toHaveLength(1);
  });

  it("refuses a second account with the same e-mail and writes nothing", async () => {
    const admin = await makeUser("admin");
    await inviteUser(db(), admin, { email: "dup@test.example", name: "First", role: "applicant" });
    await expect(inviteUser(db(), admin, { email: "dup@test.example", name: "Second", role: "applicant" })).rejects.toThrow(/already exists/);
    expect(await db().select().from(outbox)).toHaveLength(1);
    expect(await listAuditByAction(db(), "user.invited")).toHaveLength(1);
  });

  it("resets a password by e-mail link, and says nothing about unknown addresses", async () => {
    const u = await makeUser("technician");
    await requestPasswordReset(db(), "unknown@test.example");
    expect(await db().select().from(outbox)).toHaveLength(0);
    await requestPasswordReset(db(), u.email);
    const [mail] = await db().select().from(outbox);
    const token = mail!.textBody.match(/\/reset\/([A-Za-z0-9_-]{43})/)![1]!;
    await setPasswordWithToken(db(), "reset", token, "fresh password 2026");
    expect((await verifyCredentials(db(), u.email, u.password, "local")).ok).toBe(false);
    expect((await verifyCredentials(db(), u.email, "fresh password 2026", "local")).ok).toBe(true);
  });

  it("deactivation and role change end existing sessions; a stale version is a conflict", async () => {
    const admin = await makeUser("admin");
    const u = await makeUser("examiner");
    const before = (await db().select().from(users).where(eq(users.id, u.id)))[0]!;
    expect(await getActiveSessionUser(db(), u.id, before.sessionVersion)).not.toBeNull();

    await updateUser(db(), admin, u.id, { version: before.version, role: "supervisor" });
    expect(await getActiveSessionUser(db(), u.id, before.sessionVersion)).toBeNull();
    await expect(updateUser(db(), admin, u.id, { version: before.version, status: "deactivated" })).rejects.toThrow(/changed/);

    const mid = (await db().select().from(users).where(eq(users.id, u.id)))[0]!;
    await updateUser(db(), admin, u.id, { version: mid.version, status: "deactivated" });
    expect(await getActiveSessionUser(db(), u.id, mid.sessionVersion)).toBeNull();
    expect(await getActiveSessionUser(db(), u.id, mid.sessionVersion + 1)).toBeNull();
    await expect(updateUser(db(), admin, admin.id, { version: 1, status: "deactivated" })).rejects.toThrow(/your own/);
  });
});
