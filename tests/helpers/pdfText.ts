/** Text of every page of a PDF, through pdf.js (legacy build for Node), words joined by single spaces. */
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

export async function pdfText(bytes: Uint8Array): Promise<{ pages: string[]; text: string }> {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, disableFontFace: true, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    pages.push(content.items.map((it) => ("str" in it ? it.str : "")).join(" ").replace(/\s+/g, " ").trim());
  }
  await doc.destroy();
  return { pages, text: pages.join("\n") };
}
