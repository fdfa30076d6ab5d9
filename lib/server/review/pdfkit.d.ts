// The part of pdfkit 0.20's API that the report uses (pdfkit ships no TypeScript types).
declare module "pdfkit" {
  interface TextOptions { width?: number; align?: "left" | "right" | "center" | "justify"; continued?: boolean; lineGap?: number; underline?: boolean; lineBreak?: boolean; baseline?: string | number; features?: string[] }
  interface DocumentOptions { size?: string | [number, number]; margin?: number; margins?: { top: number; bottom: number; left: number; right: number }; info?: Record<string, string | Date>; compress?: boolean; bufferPages?: boolean; autoFirstPage?: boolean; pdfVersion?: string; lang?: string; displayTitle?: boolean }
  class PDFDocument {
    constructor(options?: DocumentOptions);
    readonly page: { width: number; height: number; margins: { top: number; bottom: number; left: number; right: number } };
    x: number;
    y: number;
    registerFont(name: string, src: string): this;
    font(name: string): this;
    fontSize(size: number): this;
    fillColor(color: string): this;
    strokeColor(color: string): this;
    lineWidth(w: number): this;
    text(text: string, options?: TextOptions): this;
    text(text: string, x: number, y: number, options?: TextOptions): this;
    moveDown(lines?: number): this;
    moveTo(x: number, y: number): this;
    lineTo(x: number, y: number): this;
    rect(x: number, y: number, w: number, h: number): this;
    circle(x: number, y: number, r: number): this;
    stroke(): this;
    fill(color?: string): this;
    addPage(options?: DocumentOptions): this;
    save(): this;
    restore(): this;
    translate(x: number, y: number): this;
    scale(x: number, y?: number): this;
    widthOfString(text: string, options?: TextOptions): number;
    currentLineHeight(includeGap?: boolean): number;
    link(x: number, y: number, w: number, h: number, url: string): this;
    moveTo(x: number, y: number): this;
    bufferedPageRange(): { start: number; count: number };
    switchToPage(n: number): this;
    heightOfString(text: string, options?: TextOptions): number;
    on(event: "data", cb: (chunk: Uint8Array) => void): this;
    on(event: "end", cb: () => void): this;
    on(event: "error", cb: (err: Error) => void): this;
    end(): void;
  }
  export default PDFDocument;
}
