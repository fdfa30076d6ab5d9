/**
 * The Content-Security-Policy of pages: scripts only from our origin and with this response's
 * nonce ('strict-dynamic' lets the scripts Next.js loads with the nonce load their chunks), no
 * 'unsafe-inline' for scripts; 'unsafe-eval' only under `next dev` (React's dev tools need it).
 * Styles keep 'unsafe-inline': server-rendered style attributes (React style props) and the
 * <style> element and style attributes of Observable Plot's SVG (notebook charts, report figure)
 * need it; a style cannot run code. Set by proxy.ts on every page response, with the nonce passed
 * to the render in the request header x-nonce (Next.js puts it on its own script tags).
 * API routes and static files get next.config.js's fixed policy (no inline script at all).
 */
export function pageContentSecurityPolicy(nonce: string, opts: { dev?: boolean } = {}): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${opts.dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "object-src 'none'",
    "frame-ancestors 'none'",
    "base-uri 'self'",
    "form-action 'self'",
  ].join("; ");
}

/** A fresh nonce: 16 random bytes, base64 (unguessable, one per response). */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}
