/**
 * The fonts of every PDF we write: DejaVu Sans (regular and bold) from the dejavu-fonts-ttf npm
 * package, embedded (pdfkit subsets them), so text stays text and Greek letters, superscript
 * digits, "−" and "×" print as such on any reader. One family for body text and figures.
 */
import { existsSync } from "node:fs";
import path from "node:path";

export const FIGURE_FONT_FAMILY = "DejaVu Sans";

/** Absolute paths of the regular and bold TTF files; an Error naming the path when missing. */
export function fontFiles(): { regular: string; bold: string } {
  const dir = path.join(process.cwd(), "node_modules", "dejavu-fonts-ttf", "ttf");
  const regular = path.join(dir, "DejaVuSans.ttf"), bold = path.join(dir, "DejaVuSans-Bold.ttf");
  for (const f of [regular, bold]) if (!existsSync(f)) throw new Error(`PDF font missing: ${f} (npm ci installs dejavu-fonts-ttf)`);
  return { regular, bold };
}
