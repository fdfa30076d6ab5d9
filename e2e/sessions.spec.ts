/**
 * Sessions and tokens in the browser: signing out ends the session (the old cookie is refused),
 * "Sign out everywhere" on the Account page ends the session of another browser too, and the
 * tokens table shows each token's expiry and renews it. Screenshots go to .data/e2e-shots/.
 */
import { test, expect, type Browser, type Page } from "@playwright/test";
import { DEMO, uiSignIn } from "./helpers";

const SHOTS = ".data/e2e-shots";
const stamp = Date.now().toString(36);
const carol = { name: "Carol Sessions", email: `carol-${stamp}@example.org`, password: "ember-lattice-quartz-9" };
const dave = { name: "Dave Tokens", email: `dave-${stamp}@example.org`, password: "copper-meadow-signal-4" };

async function sessionCookie(page: Page) {
  const all = await page.context().cookies();
  const c = all.find((x) => x.name === "next-auth.session-token");
  expect(c, "session cookie after sign-in").toBeTruthy();
  return c!;
}

async function signUp(page: Page, who: typeof carol) {
  await page.goto("/signup");
  await page.getByLabel("Name").fill(who.name);
  await page.getByLabel("E-mail").fill(who.email);
  await page.getByLabel("Password").fill(who.password);
  await page.getByRole("button", { name: /create account/i }).click();
  await expect(page).toHaveURL(/\/groups/, { timeout: 20_000 });
}

async function newPage(browser: Browser): Promise<Page> {
  return (await browser.newContext()).newPage();
}

test("sign out ends the session: the old cookie then gets 401 and the pages send it to sign-in", async ({ browser, playwright, baseURL }) => {
  const page = await newPage(browser);
  await uiSignIn(page, DEMO.viewer);
  const cookie = await sessionCookie(page);
  const device = (await page.context().cookies(`${baseURL}/api/auth/signin`)).find((c) => c.name.startsWith("hb-device-"));
  expect(device, "device cookie after a password sign-in").toMatchObject({ path: "/api/auth", httpOnly: true, sameSite: "Lax" });
  // A settled page first: the menu of the page the sign-in redirected through may be replaced while it opens.
  await page.goto("/account");
  await expect(page.getByRole("heading", { name: "Account" })).toBeVisible();
  await page.getByTestId("user-menu").locator("summary").click();
  await page.getByRole("button", { name: "Sign out", exact: true }).click();
  await expect(page).toHaveURL(`${baseURL}/`);

  const replay = await playwright.request.newContext({ baseURL, extraHTTPHeaders: { cookie: `${cookie.name}=${cookie.value}` } });
  expect((await replay.get("/api/groups")).status()).toBe(401);
  const again = await newPage(browser);
  await again.context().addCookies([cookie]);
  await again.goto("/groups");
  await expect(again).toHaveURL(/\/signin/);
  await replay.dispose();
});

test("sign out everywhere on the Account page ends the other browser's session too", async ({ browser }) => {
  const a = await newPage(browser);
  await signUp(a, carol);
  const b = await newPage(browser);
  await uiSignIn(b, carol.email, carol.password);
  await b.goto("/groups");
  await expect(b).toHaveURL(/\/groups/);

  await a.getByTestId("user-menu").locator("summary").click();
  await a.getByRole("link", { name: "Account and sessions" }).click();
  await expect(a.getByRole("heading", { name: "Where you are signed in" })).toBeVisible();
  await expect(a.getByTestId("sessions").locator("tbody tr")).toHaveCount(2);
  await expect(a.getByTestId("sessions")).toContainText("this browser");
  await a.screenshot({ path: `${SHOTS}/account-sessions.png`, fullPage: true });

  a.once("dialog", (d) => void d.accept());
  await a.getByRole("button", { name: "Sign out everywhere" }).click();
  await expect(a).toHaveURL(/\/signin/);
  await b.goto("/groups");
  await expect(b).toHaveURL(/\/signin/);
});

test("the tokens table shows each token's expiry and Renew moves it", async ({ browser }) => {
  const page = await newPage(browser);
  await signUp(page, dave);
  await page.getByLabel("Group name").fill(`Token Lab ${stamp}`);
  await page.getByRole("button", { name: /create group/i }).click();
  await expect(page).toHaveURL(/\/g\/token-lab/);
  const groupUrl = new URL(page.url()).pathname.split("/").slice(0, 3).join("/");
  await page.goto(`${groupUrl}/settings`);

  const form = page.getByTestId("token-create");
  await form.getByLabel("Name").fill("fitting laptop");
  await form.getByLabel("Expires after").selectOption("30");
  await form.getByRole("button", { name: "Create token" }).click();
  await expect(page.getByTestId("token-secret")).toBeVisible();
  const expiry = page.getByTestId("token-expiry").first();
  const in30 = new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10);
  await expect(expiry).toContainText(in30);
  await expect(expiry).toContainText("UTC");

  await page.getByRole("button", { name: "Renew" }).first().click();
  const in90 = new Date(Date.now() + 90 * 86_400_000).toISOString().slice(0, 10);
  await expect(expiry).toContainText(in90);
  await page.screenshot({ path: `${SHOTS}/tokens-expiry.png`, fullPage: true });
});
