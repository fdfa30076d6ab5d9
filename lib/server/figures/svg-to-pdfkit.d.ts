// svg-to-pdfkit 0.1.8 ships no types: the call the figures use.
declare module "svg-to-pdfkit" {
  import type PDFDocument from "pdfkit";
  interface SvgToPdfOptions {
    width?: number; height?: number; assumePt?: boolean; preserveAspectRatio?: string;
    fontCallback?: (family: string, bold: boolean, italic: boolean) => string;
    warningCallback?: (message: string) => void;
  }
  export default function SVGtoPDF(doc: PDFDocument, svg: string, x: number, y: number, options?: SvgToPdfOptions): void;
}
