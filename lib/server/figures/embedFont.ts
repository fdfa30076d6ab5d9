/**
 * A standalone SVG figure with its font inside: the DejaVu Sans TTF as a data: URL in an
 * @font-face rule, so the file shows the same glyphs anywhere and its text stays text.
 */
import { readFileSync } from "node:fs";
import { FIGURE_FONT_FAMILY, fontFiles } from "./fonts";

let cached: string | null = null;

export function embedFont(svg: string): string {
  cached ??= readFileSync(fontFiles().regular).toString("base64");
  const style = `<defs><style>@font-face{font-family:"${FIGURE_FONT_FAMILY}";src:url(data:font/ttf;base64,${cached}) format("truetype");}</style></defs>`;
  return svg.replace(/(<svg[^>]*>)/, `$1${style}`);
}
