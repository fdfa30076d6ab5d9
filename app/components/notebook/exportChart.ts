/**
 * Chart export in the browser: the SVG as drawn (with xmlns and the page's font and ink made
 * explicit), a PNG at twice the size through a canvas, and any text as a download.
 */

/** The chart's main SVG (the largest one: legends are separate, smaller SVGs). */
export function mainSvg(host: Element): SVGSVGElement | null {
  const all = [...host.querySelectorAll("svg")] as SVGSVGElement[];
  return all.sort((a, b) => area(b) - area(a))[0] ?? null;
}

function area(svg: SVGSVGElement): number {
  return Number(svg.getAttribute("width") ?? 0) * Number(svg.getAttribute("height") ?? 0);
}

/** Standalone SVG text of a drawn chart. */
export function svgText(svg: SVGSVGElement): string {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  copy.setAttribute("xmlns", "http://www.w3.org/2000/svg");
  copy.setAttribute("xmlns:xlink", "http://www.w3.org/1999/xlink");
  copy.style.fontFamily = "Inter, 'DejaVu Sans', Arial, sans-serif";
  copy.style.color = "#1e2431";
  copy.style.background = "#ffffff";
  copy.querySelectorAll('[aria-label="tip"]').forEach((n) => n.remove());
  return new XMLSerializer().serializeToString(copy);
}

export function download(name: string, blob: Blob): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadText(name: string, text: string, type: string): void {
  download(name, new Blob([text], { type }));
}

/** PNG of the SVG at `scale` × its size, on white, via an image of the SVG blob. */
export async function downloadPng(name: string, svg: SVGSVGElement, scale = 2): Promise<void> {
  const text = svgText(svg);
  const w = Number(svg.getAttribute("width") ?? svg.clientWidth), h = Number(svg.getAttribute("height") ?? svg.clientHeight);
  const url = URL.createObjectURL(new Blob([text], { type: "image/svg+xml" }));
  try {
    const img = new Image();
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error("the chart could not be turned into an image"));
      img.src = url;
    });
    const canvas = document.createElement("canvas");
    canvas.width = Math.round(w * scale);
    canvas.height = Math.round(h * scale);
    const ctx = canvas.getContext("2d");
    if (!ctx) throw new Error("no canvas available");
    ctx.fillStyle = "#ffffff";
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
    const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, "image/png"));
    if (!blob) throw new Error("the image could not be encoded");
    download(name, blob);
  } finally {
    URL.revokeObjectURL(url);
  }
}
