/**
 * renderMarkdown (lib/server/markdown.ts, used for note steps, comments and the report) turns
 * classic XSS payloads into harmless HTML: the output, parsed as a document, holds only
 * allow-listed elements, no event-handler or style attribute, and no link or source whose
 * scheme is not http(s) or mailto. Payloads are common test strings (common practice: the
 * usual filter-evasion families — script tags, event handlers, javascript: and data: URLs,
 * SVG/MathML, entity and case tricks, Markdown link and image syntax).
 */
import { describe, it, expect } from "vitest";
import { parseHTML } from "linkedom";
import { renderMarkdown } from "../../lib/server/markdown";

const PAYLOADS = [
  "<script>alert(1)</script>",
  "<SCRIPT SRC=//evil.example/x.js></SCRIPT>",
  "<img src=x onerror=alert(1)>",
  "<svg onload=alert(1)>",
  "<svg><script>alert(1)</script></svg>",
  "<math><mtext><table><mglyph><style><img src=x onerror=alert(1)>",
  "<iframe src=\"javascript:alert(1)\"></iframe>",
  "<a href=\"javascript:alert(1)\">click</a>",
  "<a href=\"JaVaScRiPt:alert(1)\">click</a>",
  "<a href=\"&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;alert(1)\">x</a>",
  "<a href=\"  javascript:alert(1)\">x</a>",
  "[click](javascript:alert(1))",
  "[click](JAVASCRIPT:alert(1))",
  "[click](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)",
  "[click](vbscript:msgbox(1))",
  "![x](javascript:alert(1))",
  "![x](x\" onerror=\"alert(1))",
  "<div style=\"background:url(javascript:alert(1))\">x</div>",
  "<p style=\"position:fixed;top:0;left:0;width:100%;height:100%\">overlay</p>",
  "<body onload=alert(1)>",
  "<input autofocus onfocus=alert(1)>",
  "<details open ontoggle=alert(1)>",
  "<form action=\"https://evil.example\"><button>go</button></form>",
  "<object data=\"javascript:alert(1)\"></object>",
  "<embed src=\"javascript:alert(1)\">",
  "<meta http-equiv=\"refresh\" content=\"0;url=javascript:alert(1)\">",
  "<base href=\"https://evil.example/\">",
  "<link rel=stylesheet href=//evil.example/x.css>",
  "<<script>script>alert(1)<</script>/script>",
  "<scr<script>ipt>alert(1)</script>",
  "`<script>alert(1)</script>`",
  "```html\n<script>alert(1)</script>\n```",
  "<a href=\"https://ok.example\" onclick=\"alert(1)\">ok</a>",
  "<td background=\"javascript:alert(1)\">",
  "<video><source onerror=\"alert(1)\"></video>",
  "<x onmouseover=alert(1)>hover</x>",
  "\"><script>alert(1)</script>",
  "<noscript><p title=\"</noscript><img src=x onerror=alert(1)>\">",
  "[a](https://ok.example \"title\\\" onmouseover=alert(1)\")",
  // URL-carrying attributes other than href/src/cite (the family of the sanitize-html advisory
  // fixed in 2.17.6; we pin 2.17.5 for Node 20, so our allow-list must keep them all out).
  "<button formaction=\"javascript:alert(1)\">go</button>",
  "<video poster=\"javascript:alert(1)\"></video>",
  "<a href=\"https://ok.example\" ping=\"javascript:alert(1)\">ok</a>",
  "<svg><a xlink:href=\"javascript:alert(1)\"><text>x</text></a></svg>",
  "<table background=\"javascript:alert(1)\"><tr><td>x</td></tr></table>",
  "<a href=\"https://ok.example\" action=\"javascript:alert(1)\" xlink:href=\"javascript:alert(1)\">ok</a>",
];

const ALLOWED_TAGS = new Set(["P", "BR", "STRONG", "EM", "DEL", "CODE", "PRE", "BLOCKQUOTE", "UL", "OL", "LI", "H3", "H4", "H5", "H6", "TABLE", "THEAD", "TBODY", "TR", "TH", "TD", "A", "HR", "SUB", "SUP", "HTML", "HEAD", "BODY"]);
const ALLOWED_ATTRS = new Set(["href", "title", "rel", "target", "align"]);

function problems(html: string): string[] {
  const { document } = parseHTML(`<!doctype html><html><head></head><body>${html}</body></html>`);
  const out: string[] = [];
  for (const el of document.querySelectorAll("*")) {
    if (!ALLOWED_TAGS.has(el.tagName.toUpperCase())) out.push(`element <${el.tagName.toLowerCase()}>`);
    for (const attr of Array.from(el.attributes) as { name: string; value: string }[]) {
      if (!ALLOWED_ATTRS.has(attr.name.toLowerCase())) out.push(`attribute ${attr.name} on <${el.tagName.toLowerCase()}>`);
      if (attr.name.toLowerCase() === "href" && !/^(https?:|mailto:|#|\/(?!\/))/i.test(attr.value.trim())) out.push(`href ${attr.value}`);
    }
  }
  return out;
}

describe("renderMarkdown against XSS payloads", () => {
  it.each(PAYLOADS)("renderMarkdown(%j) keeps only allow-listed, inert HTML", (payload) => {
    const html = renderMarkdown(payload);
    expect(problems(html)).toEqual([]);
    // Payload text may survive as escaped text (harmless); no live tag may.
    expect(html).not.toMatch(/<(script|iframe|svg|math|img|object|embed|style|form|input|base|meta|link)\b/i);
  });

  it("renderMarkdown keeps ordinary formatting and safe links", () => {
    const html = renderMarkdown("**γ** fit over *2–6 K*, see [the log](https://example.org/log) and `C/T`");
    expect(html).toContain("<strong>γ</strong>");
    expect(html).toContain('href="https://example.org/log"');
    expect(html).toContain('rel="noopener noreferrer nofollow"');
    expect(problems(html)).toEqual([]);
  });

  it("renderMarkdown of a very long input renders at most 50 000 characters", () => {
    const html = renderMarkdown("a".repeat(200_000));
    expect(html.length).toBeLessThan(50_100);
  });
});
