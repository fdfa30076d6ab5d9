/**
 * Markdown of note steps and comments to HTML, on the server only: `marked` renders, then
 * `sanitize-html` keeps a short allow-list (text formatting, lists, tables, code, links with
 * http(s)/mailto and rel="noopener"), so nothing a member types can run script in another
 * member's browser. Raw HTML in the input is escaped away by the sanitiser, not trusted.
 */
import { marked } from "marked";
import sanitizeHtml from "sanitize-html";

const ALLOWED = {
  allowedTags: ["p", "br", "strong", "em", "del", "code", "pre", "blockquote", "ul", "ol", "li", "h3", "h4", "h5", "h6", "table", "thead", "tbody", "tr", "th", "td", "a", "hr", "sub", "sup"],
  allowedAttributes: { a: ["href", "title"], th: ["align"], td: ["align"] },
  allowedSchemes: ["http", "https", "mailto"],
  transformTags: {
    a: sanitizeHtml.simpleTransform("a", { rel: "noopener noreferrer nofollow", target: "_blank" }),
    h1: "h3",
    h2: "h4",
  },
} satisfies sanitizeHtml.IOptions;

/** Sanitised HTML of `markdown` (at most 50 000 characters are rendered). */
export function renderMarkdown(markdown: string): string {
  const html = marked.parse(markdown.slice(0, 50_000), { async: false, gfm: true, breaks: false }) as string;
  return sanitizeHtml(html, { ...ALLOWED, allowedAttributes: { ...ALLOWED.allowedAttributes, a: ["href", "title", "rel", "target"] } });
}
