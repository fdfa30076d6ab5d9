import { describe, it, expect } from "vitest";
import { writeCsv, encodeCell, neutraliseCell, formatNumber } from "../../lib/engine/csv";
import { InputError } from "../../lib/engine/errors";

/** A minimal RFC 4180 reader, written independently of the writer, to check round trips. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = "";
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') { cell += '"'; i++; }
      else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ",") { row.push(cell); cell = ""; }
    else if (ch === "\r" && text[i + 1] === "\n") { row.push(cell); rows.push(row); row = []; cell = ""; i++; }
    else cell += ch;
  }
  return rows;
}

/** Seeded 32-bit LCG (Numerical Recipes constants) so the random cases are repeatable. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

describe("neutraliseCell", () => {
  it.each(["=SUM(A1:A9)", "+1+2", "-2+3", "@cmd", "\tx", "\rx"])("neutraliseCell(%j) prefixes an apostrophe", (text) => {
    expect(neutraliseCell(text)).toBe(`'${text}`);
  });
  it("neutraliseCell leaves ordinary text and the empty string alone", () => {
    expect(neutraliseCell("Nb0.75Mo0.25")).toBe("Nb0.75Mo0.25");
    expect(neutraliseCell(" =not first")).toBe(" =not first");
    expect(neutraliseCell("")).toBe("");
  });
});

describe("formatNumber", () => {
  it("formatNumber round-trips 10 000 seeded doubles of every magnitude exactly", () => {
    const r = lcg(20261202);
    const buf = new DataView(new ArrayBuffer(8));
    for (let i = 0; i < 10_000; i++) {
      buf.setUint32(0, Math.floor(r() * 2 ** 32));
      buf.setUint32(4, Math.floor(r() * 2 ** 32));
      const x = buf.getFloat64(0);
      if (!Number.isFinite(x)) continue;
      expect(Number(formatNumber(x))).toBe(x === 0 ? 0 : x);
    }
  });
  it("formatNumber writes the shortest form (0.1 stays 0.1, 1/3 keeps 17 digits)", () => {
    expect(formatNumber(0.1)).toBe("0.1");
    expect(formatNumber(1 / 3)).toBe("0.3333333333333333");
    expect(formatNumber(1.0000000000000002)).toBe("1.0000000000000002");
  });
  it("formatNumber gives an empty cell for NaN and ±Infinity and 0 for −0", () => {
    expect([NaN, Infinity, -Infinity].map(formatNumber)).toEqual(["", "", ""]);
    expect(formatNumber(-0)).toBe("0");
  });
});

describe("encodeCell", () => {
  it("encodeCell keeps negative numbers as numbers but neutralises the same text", () => {
    expect(encodeCell(-1.25)).toBe("-1.25");
    expect(encodeCell("-1.25")).toBe("'-1.25");
  });
  it("encodeCell quotes separators, quotes and line breaks after neutralising", () => {
    expect(encodeCell('a,"b"')).toBe('"a,""b"""');
    expect(encodeCell("=1,2")).toBe(`"'=1,2"`);
    expect(encodeCell("line\nbreak")).toBe('"line\nbreak"');
    expect(encodeCell(null)).toBe("");
  });
});

describe("writeCsv", () => {
  it("writeCsv puts units in the header and ends lines with CRLF", () => {
    const text = writeCsv([{ name: "sample" }, { name: "gamma", unit: "mJ mol^-1 K^-2" }], [["Cu", 0.695], ["=HYPERLINK(1)", -0.5]]);
    expect(text).toBe("sample,gamma (mJ mol^-1 K^-2)\r\nCu,0.695\r\n'=HYPERLINK(1),-0.5\r\n");
  });
  it("writeCsv round-trips seeded hostile text through an independent reader", () => {
    const r = lcg(7);
    const alphabet = ['=', '+', '-', '@', '\t', '"', ',', '\n', 'a', 'Z', ' ', 'γ', '1', '.'];
    const rows = Array.from({ length: 200 }, () => Array.from({ length: 3 }, () =>
      Array.from({ length: 1 + Math.floor(r() * 6) }, () => alphabet[Math.floor(r() * alphabet.length)]).join("")));
    const back = readCsv(writeCsv([{ name: "a" }, { name: "b" }, { name: "c" }], rows));
    expect(back.length).toBe(201);
    back.slice(1).forEach((row, i) => row.forEach((cell, j) => {
      expect(cell).toBe(neutraliseCell(rows[i]![j]!));
      expect(/^[=+\-@\t\r]/.test(cell)).toBe(false);
    }));
  });
  it("writeCsv throws InputError naming the line of a short row", () => {
    expect(() => writeCsv([{ name: "a" }, { name: "b" }], [[1, 2], [3]])).toThrow(InputError);
    expect(() => writeCsv([{ name: "a" }, { name: "b" }], [[1, 2], [3]])).toThrow(/line 3/);
  });
});
