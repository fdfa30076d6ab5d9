/**
 * Import as a person would: every ambiguous or bad file is caught at preview, with its lines,
 * before anything is stored; the parsed curve is drawn before storing; several files of one
 * layout are stored together. (Files here are invented test data.)
 */
import { test, expect, type Page } from "@playwright/test";
import { DEMO, uiSignIn } from "./helpers";

const GROUP = "/g/cryogenic-calorimetry-lab-demo";

async function openSample(page: Page): Promise<void> {
  await uiSignIn(page, DEMO.analyst);
  await page.goto(`${GROUP}/samples`);
  await page.getByRole("link", { name: /NM-02 / }).first().click();
  await expect(page.getByTestId("import-panel")).toBeVisible();
}

function file(name: string, text: string) {
  return { name, mimeType: "text/csv", buffer: Buffer.from(text) };
}

/** Invented curve C = γT + βT³ (γ = 2 mJ/K², β = 0.05 mJ/K⁴ for the sample), in mJ/K. */
function curve(n: number, t0 = 1.8, decimal = "."): string {
  const rows = ["T (K),C (mJ/K)"];
  for (let i = 0; i < n; i++) {
    const T = t0 + i * 0.4;
    rows.push(`${T.toFixed(3)},${(2e-3 * T + 5e-5 * T ** 3).toFixed(7)}`.replace(/\./g, decimal));
  }
  return rows.join("\n") + "\n";
}

test("a comma-delimited file written with decimal commas is asked about at preview, never stored as guessed", async ({ page }) => {
  await openSample(page);
  await page.getByLabel("Data files").setInputFiles(file("comma.csv", "T (K),C (mJ/K)\n1,80,0,0036\n2,20,0,0045\n2,60,0,0056\n"));
  await page.getByRole("button", { name: "Read file" }).click();
  const alert = page.getByTestId("import-ambiguity");
  await expect(alert).toContainText("line 1");
  await expect(alert).toContainText(/names 2 columns .* 4 comma-separated cells/);
  await expect(page.getByTestId("store-measurement")).toBeDisabled();
  await page.screenshot({ path: "test-results/import-ambiguous.png", fullPage: true });
});

test("every refused row and every repeated or decreasing temperature is listed with its line at preview", async ({ page }) => {
  await openSample(page);
  const text = "T (K),C (mJ/K)\n1.8,0.0036\n-2.2,0.0045\n2.6,0.0056\n2.6,0.0057\nabc,0.0060\n2.4,0.0050\n3.0,0.0074\n";
  await page.getByLabel("Data files").setInputFiles(file("bad.csv", text));
  await page.getByRole("button", { name: "Read file" }).click();
  await page.getByLabel("Heat capacity unit").selectOption("mJ/K");
  const invalid = page.getByTestId("import-invalid");
  await expect(invalid).toContainText("line 3, column 1");
  await expect(invalid).toContainText("line 6, column 1");
  await expect(page.getByTestId("import-duplicates")).toContainText("line 5: T = 2.6, as on line 4");
  await expect(page.getByTestId("import-decreasing")).toContainText("line 7: T = 2.4, below line 5");
  await expect(page.getByTestId("import-curve").locator("svg").first()).toBeVisible();
  await page.screenshot({ path: "test-results/import-bad-lines.png", fullPage: true });
  await page.getByTestId("store-measurement").click();
  await expect(page.getByTestId("import-summary")).toContainText(/0 stored, 1 refused/);
  await expect(page.getByTestId("import-summary")).toContainText(/line 3/);
});

test("several files with one layout are previewed, mapped once and stored one by one with a summary", async ({ page }) => {
  await openSample(page);
  await page.getByLabel("Data files").setInputFiles([file("run-a.csv", curve(30)), file("run-b.csv", curve(25, 2.0))]);
  await page.getByRole("button", { name: "Read 2 files" }).click();
  await expect(page.getByTestId("import-files")).toContainText("All 2 files have the same columns");
  await page.getByLabel("Heat capacity unit").selectOption("mJ/K");
  await page.getByLabel("σ when there is no σ column (% of C)").fill("0.5");
  await expect(page.getByTestId("import-chart-ct").locator("svg").first()).toBeVisible();
  await page.screenshot({ path: "test-results/import-batch.png", fullPage: true });
  await page.getByRole("button", { name: "Store 2 measurements" }).click();
  const summary = page.getByTestId("import-summary");
  await expect(summary).toContainText("2 stored");
  await expect(summary.getByRole("link", { name: "run-a" })).toBeVisible();
  await expect(summary.getByRole("link", { name: "run-b" })).toBeVisible();
  await expect(summary).toContainText("30 points");
});

test("a 100 000-point measurement page draws both charts, reduced per pixel column, and says so", async ({ page, baseURL }) => {
  await openSample(page);
  const samplePath = new URL(page.url()).pathname;
  const sampleId = samplePath.split("/").pop()!;
  const rows = ["T (K),C (mJ/K)"];
  for (let i = 0; i < 100_000; i++) {
    const T = 0.4 + (i * 29.6) / 99_999;
    rows.push(`${T.toPrecision(8)},${(2e-3 * T + 5e-5 * T ** 3).toPrecision(7)}`);
  }
  const res = await page.request.post(`/api/groups/cryogenic-calorimetry-lab-demo/samples/${sampleId}/measurements`, {
    headers: { origin: baseURL! },
    multipart: {
      file: { name: "dense.csv", mimeType: "text/csv", buffer: Buffer.from(rows.join("\n")) },
      options: JSON.stringify({ kind: "sample", label: "dense sweep (invented)", mapping: { temperature: 0, heatCapacity: 1 }, units: { temperature: "K", heatCapacity: "mJ/K" } }),
    },
  });
  expect(res.status()).toBe(201);
  const { measurement } = await res.json();
  await page.goto(`${GROUP}/measurements/${measurement.id}`);
  await expect(page.getByTestId("chart-c-vs-t").locator("svg").first()).toBeVisible();
  await expect(page.getByTestId("chart-ct-vs-t2").locator("svg").first()).toBeVisible();
  await expect(page.getByTestId("chart-reduced")).toContainText("100 000 points");
  const dots = await page.getByTestId("chart-c-vs-t").locator("svg circle").count();
  expect(dots).toBeGreaterThan(1000);
  expect(dots).toBeLessThan(30_000);
  await page.screenshot({ path: "test-results/measurement-100k.png", fullPage: true });
});
