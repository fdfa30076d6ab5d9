import { expect, type APIRequestContext, type Page } from "@playwright/test";

export const DEMO_PASSWORD = "heatbook-demo";
export const DEMO = {
  owner: "olga.owner@demo.heatbook",
  analyst: "arun.analyst@demo.heatbook",
  reviewer: "rosa.reviewer@demo.heatbook",
  viewer: "viktor.viewer@demo.heatbook",
  outsider: "sven.second@demo.heatbook",
} as const;

/** Sign in through next-auth's credentials endpoint; the session cookie stays in `request`. */
export async function apiSignIn(request: APIRequestContext, email: string, password = DEMO_PASSWORD): Promise<void> {
  const csrf = await (await request.get("/api/auth/csrf")).json();
  const res = await request.post("/api/auth/callback/password", {
    form: { csrfToken: csrf.csrfToken, email, password, json: "true" },
    maxRedirects: 0,
  });
  expect([200, 302]).toContain(res.status());
  const session = await (await request.get("/api/auth/session")).json();
  expect(session?.user?.email, `signed in as ${email}`).toBe(email);
}

/** Sign in through the page, as a person would. */
export async function uiSignIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: /sign in/i }).click();
  await expect(page).not.toHaveURL(/\/signin/);
}
