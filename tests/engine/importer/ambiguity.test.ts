/** Files that read two ways are reported, not guessed; order checks of the temperature column. */
import { describe, expect, it } from "vitest";
import { checkTemperatures, parseDelimited } from "../../../lib/engine/importer";

const amb = (text: string, options = {}) => parseDelimited(text, options).ambiguity;

describe("parseDelimited ambiguity", () => {
  it("parseDelimited reports a decimal comma inside a comma-delimited file, naming the header line and the cell counts", () => {
    const a = amb("T (K),C (mJ/K)\n1,5,2,3\n2,0,4,6\n2,5,7,1\n");
    expect(a?.kind).toBe("decimal-comma");
    expect(a?.line).toBe(1);
    expect(a?.message).toMatch(/names 2 columns.*line 2 has 4 comma-separated cells/);
  });

  it("parseDelimited finds the same after a preamble and comment lines", () => {
    const a = amb("# instrument export\nSample: NM-3\n\nTemp,HC\n# units K, uJ/K\n1,80,0,12\n1,90,0,14\n");
    expect(a).toMatchObject({ kind: "decimal-comma", line: 4 });
  });

  it("parseDelimited reports a header whose cell count differs from the data's in other delimiters", () => {
    const a = amb("T\tC\tsigma\n1.5\t2.3\n2.0\t4.6\n");
    expect(a?.kind).toBe("header-count");
    expect(a?.message).toMatch(/names 3 columns.*has 2 cells/);
  });

  it("parseDelimited asks nothing once the user has chosen the delimiter or the decimal mark", () => {
    expect(amb("T,C\n1,5,2,3\n2,0,4,6\n", { delimiter: "," })).toBeUndefined();
    expect(amb("T,C\n1,5,2,3\n2,0,4,6\n", { decimalComma: false })).toBeUndefined();
  });

  it.each([
    ["comma, decimal point", "T (K),C (mJ/K)\n1.5,2.3\n2.0,4.6\n"],
    ["semicolon, decimal comma", "T;C\n1,5;2,3\n2,0;4,6\n"],
    ["tab with σ", "T\tC\terr\n1.5\t2.3\t0.01\n2.0\t4.6\t0.02\n"],
    ["whitespace, no header", "1.5 2.3\n2.0 4.6\n2.5 7.1\n"],
    ["whitespace, decimal comma", "1,5 2,3\n2,0 4,6\n2,5 7,1\n"],
    ["name row and unit row", "T C\nK mJ/K\n1.5 2.3\n2.0 4.6\n"],
  ])("parseDelimited reads a clear %s file without asking", (_, text) => {
    expect(amb(text)).toBeUndefined();
  });
});

describe("checkTemperatures", () => {
  it("checkTemperatures lists repeated temperatures with the line of their first occurrence", () => {
    const c = checkTemperatures([1, 2, 2, 3, 1], [5, 6, 7, 8, 9]);
    expect(c.duplicates).toEqual([{ line: 7, otherLine: 6, value: 2 }, { line: 9, otherLine: 5, value: 1 }]);
    expect(c.duplicateCount).toBe(2);
  });

  it("checkTemperatures lists temperatures below the row before, with both lines", () => {
    const c = checkTemperatures([1, 3, 2, 4, 0.5], [10, 11, 12, 13, 14]);
    expect(c.decreasing).toEqual([{ line: 12, otherLine: 11, value: 2 }, { line: 14, otherLine: 13, value: 0.5 }]);
    expect(c.decreasingCount).toBe(2);
    expect(c.duplicateCount).toBe(0);
  });

  it("checkTemperatures keeps the first 50 findings and counts all", () => {
    const t = Array.from({ length: 200 }, (_, i) => 100 - i);
    const c = checkTemperatures(t, t.map((_, i) => i + 1));
    expect(c.decreasingCount).toBe(199);
    expect(c.decreasing).toHaveLength(50);
  });

  it("checkTemperatures finds nothing in an increasing column and skips NaN", () => {
    expect(checkTemperatures([1, NaN, 2, 3], [1, 2, 3, 4])).toMatchObject({ duplicateCount: 0, decreasingCount: 0 });
  });

  it("checkTemperatures refuses arrays of different lengths", () => {
    expect(() => checkTemperatures([1, 2], [1])).toThrow(RangeError);
  });
});
