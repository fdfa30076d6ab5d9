/**
 * The platform flow a newcomer goes through: sign up, create a group, invite a colleague who
 * accepts, create a sample, upload a CSV and see its plots.
 */
import { test, expect } from "@playwright/test";

const stamp = Date.now().toString(36);
const alice = { name: "Alice Tester", email: `alice-${stamp}@example.org`, password: "correct horse battery" };
const bob = { name: "Bob Tester", email: `bob-${stamp}@example.org`, password: "another long secret" };

const CSV = [
  "# invented test data",
  "T (K);C (mJ/K);dC (mJ/K)",
  ...Array.from({ length: 30 }, (_, i) => {
    const T = 2 + i * 0.5;
    const c = 1e-3 * (7.5 * T + 0.09 * T ** 3); // mJ/K for 1 mmol: γ = 7.5, β = 0.09 (invented)
    return `${T.toFixed(2).replace(".", ",")};${c.toFixed(6).replace(".", ",")};${(c * 0.005).toFixed(7).replace(".", ",")}`;
  }),
].join("\n");

async function signUp(page: import("@playwright/test").Page, who: typeof alice) {
  await page.goto("/signup");
  await page.getByLabel("Name").fill(who.name);
  await page.getByLabel("E-mail").fill(who.email);
  await page.getByLabel("Password").fill(who.password);
  await page.getByRole("button", { name: /create account|sign up/i }).click();
  await expect(page).toHaveURL(/\/groups|\/g\//, { timeout: 20_000 });
}

test("sign up, create a group, invite a colleague, create a sample, upload a CSV and see its plots", async ({ page, browser }) => {
  await signUp(page, alice);
  await page.goto("/groups");
  await page.getByLabel("Group name").fill(`Test Lab ${stamp}`);
  await page.getByRole("button", { name: /create group/i }).click();
  await expect(page).toHaveURL(/\/g\/test-lab/);
  const groupUrl = new URL(page.url()).pathname.split("/").slice(0, 3).join("/");

  await page.goto(`${groupUrl}/members`);
  await page.getByLabel("E-mail").fill(bob.email);
  await page.getByLabel("Role", { exact: true }).selectOption("analyst");
  await page.getByRole("button", { name: /create invitation link/i }).click();
  const link = await page.getByTestId("invite-link").inputValue();
  expect(link).toMatch(/\/invite\//);

  const bobContext = await browser.newContext();
  const bobPage = await bobContext.newPage();
  await signUp(bobPage, bob);
  await bobPage.goto(new URL(link!.trim()).pathname);
  await bobPage.getByRole("button", { name: /accept/i }).click();
  await expect(bobPage).toHaveURL(new RegExp(groupUrl));
  await bobContext.close();

  await page.goto(`${groupUrl}/members`);
  await expect(page.getByText(bob.email)).toBeVisible();

  await page.goto(`${groupUrl}/samples`);
  const form = page.getByTestId("sample-create");
  await form.getByLabel("Label", { exact: true }).fill("T-1 Nb0.75Mo0.25");
  await form.getByLabel("Formula", { exact: true }).fill("Nb0.75Mo0.25");
  await form.getByLabel("Mass (mg)").fill("12.5");
  await form.getByRole("button", { name: "Add sample" }).click();
  await expect(page.getByText("T-1 Nb0.75Mo0.25").first()).toBeVisible();
  await page.getByRole("link", { name: "T-1 Nb0.75Mo0.25" }).first().click();
  await expect(page.getByText(/93\.6\d/).first()).toBeVisible(); // molar mass 0.75·92.906 + 0.25·95.95 = 93.667 g/mol (IUPAC 2021 weights)

  await page.getByLabel("Data files").setInputFiles({ name: "t1.csv", mimeType: "text/csv", buffer: Buffer.from(CSV) });
  await page.getByRole("button", { name: "Read file" }).click();
  await expect(page.getByTestId("import-detected")).toContainText(/decimal comma/i);
  await page.getByLabel("Heat capacity unit").selectOption("mJ/K");
  await page.getByLabel("Measurement label").fill("T-1 zero field");
  await page.getByRole("button", { name: /store measurement/i }).click();
  await page.getByRole("status").getByRole("link", { name: "T-1 zero field" }).click();
  await expect(page).toHaveURL(/\/measurements\//, { timeout: 20_000 });
  await expect(page.getByTestId("chart-c-vs-t").locator("svg").first()).toBeVisible();
  await expect(page.getByTestId("chart-ct-vs-t2").locator("svg").first()).toBeVisible();
  await expect(page.getByText(/30 points/).first()).toBeVisible();
});
