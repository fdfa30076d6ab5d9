/**
 * Password sign-in, sign-up and password rules against a real PostgreSQL: attempts counted under
 * a row lock (parallel guesses check at most the allowance), a stranger's guesses do not keep
 * the owner out, existing and unknown accounts answer alike (message and time), weak and common
 * passwords are refused, long passwords are not truncated, old bcrypt hashes verify and are
 * upgraded, and sign-up of an existing address answers as for a new one.
 */
import { describe, it, expect, beforeAll, afterAll, afterEach } from "vitest";
import bcrypt from "bcryptjs";
import { freshDatabase, type TestDatabase } from "../helpers/db";
import { authenticate, signUp, verifyUserPassword, SIGN_UP_ANSWER } from "../../lib/server/users";
import { THROTTLE, backoffMs, type SignInClient } from "../../lib/server/auth/throttle";
import { checkPasswordHash, hashPassword, passwordProblem } from "../../lib/server/auth/password";
import { clientAddress, deviceCookie, verifiedDevice, deviceCookieName } from "../../lib/server/auth/client";

let t: TestDatabase;
const PW = "slow-glass-kettle-41";
const ANON: SignInClient = { address: null, deviceId: null };

// Cost 8 (about 20 ms a hash here): long enough that a skipped hash shows in the timing test.
beforeAll(async () => {
  process.env.HEATBOOK_BCRYPT_COST = "8";
  process.env.NEXTAUTH_SECRET ??= "heatbook-test-secret-not-for-production";
  t = await freshDatabase();
});
afterAll(async () => t.drop());
afterEach(async () => { await t.db.$executeRawUnsafe(`DELETE FROM "SignInThrottle"`); });

let n = 0;
async function account(password = PW): Promise<string> {
  const email = `owner-${++n}@example.org`;
  await signUp(t.db, { email, name: `Owner ${n}`, password });
  return email;
}

describe("authenticate: counting and back-off", () => {
  it("authenticate with 25 parallel wrong passwords checks at most the 5 free attempts and throttles the rest", async () => {
    const email = await account();
    const outcomes = await Promise.all(Array.from({ length: 25 }, () => authenticate(t.db, email, "wrong-password-000", ANON)));
    const checked = outcomes.filter((o) => !o.ok && o.reason === "invalid").length;
    expect(checked).toBe(THROTTLE.accountClient.free);
    expect(outcomes.filter((o) => !o.ok && o.reason === "throttled")).toHaveLength(25 - THROTTLE.accountClient.free);
  });

  it("authenticate after a stranger's 10 failures still accepts the owner from a browser with the owner's device cookie", async () => {
    const email = await account();
    for (let i = 0; i < 10; i++) await authenticate(t.db, email, `guess-${i}-xxxxxxx`, ANON);
    expect(await authenticate(t.db, email, PW, ANON)).toMatchObject({ ok: false, reason: "throttled" });
    const owner = await authenticate(t.db, email, PW, { address: null, deviceId: "owner-laptop-device-id" });
    expect(owner.ok).toBe(true);
  });

  it("authenticate behind a trusted proxy keeps the stranger's address waiting and accepts the owner from a clean address", async () => {
    const email = await account();
    const stranger: SignInClient = { address: "203.0.113.9", deviceId: null };
    for (let i = 0; i < 10; i++) await authenticate(t.db, email, `guess-${i}-xxxxxxx`, stranger);
    expect(await authenticate(t.db, email, PW, stranger)).toMatchObject({ ok: false, reason: "throttled" });
    expect((await authenticate(t.db, email, PW, { address: "198.51.100.4", deviceId: null })).ok).toBe(true);
  });

  it("authenticate refuses one address after its failures across 30 accounts, and other addresses are unaffected", async () => {
    const email = await account();
    const spray: SignInClient = { address: "192.0.2.77", deviceId: null };
    for (let i = 0; i < THROTTLE.address.free; i++) await authenticate(t.db, `nobody-${i}@example.org`, "x-wrong-password", spray);
    expect(await authenticate(t.db, email, PW, spray)).toMatchObject({ ok: false, reason: "throttled" });
    expect((await authenticate(t.db, email, PW, { address: "192.0.2.78", deviceId: null })).ok).toBe(true);
  });

  it("authenticate lets the wait pass: after the back-off the next attempt is checked again", async () => {
    const email = await account();
    const client: SignInClient = { address: "198.51.100.20", deviceId: null };
    for (let i = 0; i < 5; i++) await authenticate(t.db, email, "wrong-password-000", client);
    const refused = await authenticate(t.db, email, PW, client);
    expect(refused).toMatchObject({ ok: false, reason: "throttled" });
    expect(refused.ok === false && refused.reason === "throttled" && refused.retryAfterMs).toBeGreaterThan(25_000);
    await t.db.$executeRawUnsafe(`UPDATE "SignInThrottle" SET "blockedUntil" = now() - interval '1 second'`);
    expect((await authenticate(t.db, email, PW, client)).ok).toBe(true);
  });

  it("backoffMs doubles from 30 s after the free failures and stops at 1 h", () => {
    const r = THROTTLE.accountClient;
    expect([4, 5, 6, 7].map((k) => backoffMs(r, k))).toEqual([0, 30_000, 60_000, 120_000]);
    expect(backoffMs(r, 40)).toBe(3_600_000);
  });
});

describe("authenticate: existing and unknown accounts alike", () => {
  it("authenticate answers a wrong password and an unknown e-mail with the same outcome", async () => {
    const email = await account();
    expect(await authenticate(t.db, email, "wrong-password-000", ANON)).toEqual({ ok: false, reason: "invalid" });
    expect(await authenticate(t.db, "nobody-here@example.org", "wrong-password-000", ANON)).toEqual({ ok: false, reason: "invalid" });
  });

  // Tolerance: medians of 9 alternating attempts each within a factor 2 of each other (a skipped
  // hash at cost 8 is ~20 ms against ~0.5 ms, a factor of about 40).
  it("authenticate takes about as long for an unknown e-mail as for a wrong password (medians within 2×)", async () => {
    const email = await account();
    const times = { known: [] as number[], unknown: [] as number[] };
    for (let i = 0; i < 9; i++) {
      for (const [kind, who] of [["known", email], ["unknown", `ghost-${i}@example.org`]] as const) {
        const started = performance.now();
        await authenticate(t.db, who, "wrong-password-000", { address: `198.51.100.${100 + i}`, deviceId: null });
        times[kind].push(performance.now() - started);
      }
      await t.db.$executeRawUnsafe(`DELETE FROM "SignInThrottle"`);
    }
    const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
    const ratio = median(times.unknown) / median(times.known);
    expect(ratio).toBeGreaterThan(0.5);
    expect(ratio).toBeLessThan(2);
  });
});

describe("passwords", () => {
  it("passwordProblem refuses short, one-character, common and e-mail-equal passwords and accepts a long uncommon one", () => {
    expect(passwordProblem("aaaaaaaaaa")).toMatch(/at least 12 characters/);
    expect(passwordProblem("password12")).toMatch(/at least 12 characters/);
    expect(passwordProblem("aaaaaaaaaaaaaaaa")).toMatch(/4 different characters/);
    expect(passwordProblem("password1234")).toMatch(/common passwords/);
    expect(passwordProblem("QwertyUiop123")).toMatch(/common passwords/);
    expect(passwordProblem("me@example.org", ["me@example.org"])).toMatch(/e-mail address or name/);
    expect(passwordProblem("heatbook-demo")).toBeNull();
    expect(passwordProblem(PW)).toBeNull();
  });

  it("signUp refuses a common password with a message on the password field", async () => {
    await expect(signUp(t.db, { email: "weak@example.org", name: "W", password: "password1234" })).rejects.toMatchObject({ field: "password", message: expect.stringMatching(/common/) });
    expect(await t.db.user.count({ where: { email: "weak@example.org" } })).toBe(0);
  });

  it("hashPassword keeps every byte of a password longer than 72 bytes", async () => {
    const base = "é".repeat(50); // 100 bytes in UTF-8
    const a = `${base}-alpha`, b = `${base}-bravo`;
    const hash = await hashPassword(a);
    expect(await checkPasswordHash(a, hash)).toBe(true);
    expect(await checkPasswordHash(b, hash)).toBe(false);
  });

  it("authenticate accepts an old plain bcrypt hash and replaces it with the pre-hashed format", async () => {
    const email = "legacy@example.org";
    await t.db.user.create({ data: { email, name: "Legacy", passwordHash: await bcrypt.hash("legacy-password-01", 4) } });
    expect((await authenticate(t.db, email, "legacy-password-01", ANON)).ok).toBe(true);
    const stored = (await t.db.user.findUniqueOrThrow({ where: { email } })).passwordHash!;
    expect(stored.startsWith("$hb2$")).toBe(true);
    expect((await authenticate(t.db, email, "legacy-password-01", ANON)).ok).toBe(true);
  });

  it("verifyUserPassword tells the user's password from another and is false for an unknown user", async () => {
    const email = await account();
    const user = await t.db.user.findUniqueOrThrow({ where: { email } });
    expect(await verifyUserPassword(t.db, user.id, PW)).toBe(true);
    expect(await verifyUserPassword(t.db, user.id, PW + "x")).toBe(false);
    expect(await verifyUserPassword(t.db, "00000000-0000-4000-8000-000000000000", PW)).toBe(false);
  });
});

describe("signUp of an existing address", () => {
  it("signUp answers an existing address exactly as a new one, leaves the account unchanged and writes a notice to the outbox", async () => {
    const email = await account();
    const before = await t.db.user.findUniqueOrThrow({ where: { email } });
    const fresh = await signUp(t.db, { email: "brand-new@example.org", name: "New", password: "fresh-cobalt-ridge-7" });
    const again = await signUp(t.db, { email: email.toUpperCase(), name: "Impostor", password: "fresh-cobalt-ridge-7" });
    expect(again).toEqual(fresh);
    expect(again.message).toBe(SIGN_UP_ANSWER);
    const after = await t.db.user.findUniqueOrThrow({ where: { email } });
    expect(after).toEqual(before);
    const mail = await t.db.outbox.findMany({ where: { toEmail: email } });
    expect(mail).toHaveLength(1);
    expect(mail[0]!.subject).toMatch(/your address/);
    expect(await t.db.outbox.count({ where: { toEmail: "brand-new@example.org" } })).toBe(0);
  });
});

describe("sign-in client", () => {
  it("clientAddress takes the entry our proxy wrote (rightmost) and nothing without HEATBOOK_TRUST_PROXY", () => {
    expect(clientAddress("6.6.6.6, 198.51.100.4", "1")).toBe("198.51.100.4");
    expect(clientAddress("6.6.6.6, 198.51.100.4, 10.0.0.2", "2")).toBe("198.51.100.4");
    expect(clientAddress("198.51.100.4", undefined)).toBeNull();
    expect(clientAddress(null, "1")).toBeNull();
  });

  it("verifiedDevice accepts the cookie deviceCookie made for that account only, and refuses a tampered one", () => {
    const set = deviceCookie("a@example.org", null, false)!;
    const pair = set.split(";")[0]!;
    const id = verifiedDevice(`x=1; ${pair}`, "a@example.org");
    expect(id).toMatch(/^[A-Za-z0-9_-]{22}$/);
    expect(verifiedDevice(pair.replace(deviceCookieName("a@example.org"), deviceCookieName("b@example.org")), "b@example.org")).toBeNull();
    const tampered = pair.slice(0, -1) + (pair.endsWith("A") ? "B" : "A");
    expect(verifiedDevice(tampered, "a@example.org")).toBeNull();
  });
});
