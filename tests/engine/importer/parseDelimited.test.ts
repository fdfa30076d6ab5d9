import { describe, expect, it } from "vitest";
import { parseDelimited } from "../../../lib/engine/importer";
import { InputError } from "../../../lib/engine/errors";

const col = (text: string, c: number, opts = {}) => Array.from(parseDelimited(text, opts).rows[c]);

describe("parseDelimited", () => {
  it("parseDelimited reads comma data with a header, units, BOM and CRLF", () => {
    const t = parseDelimited("\ufeffT (K),C [mJ/K]\r\n1.5,2.25\r\n2.5,3e-1\r\n", { fileName: "cu.csv" });
    expect(t.delimiter).toBe(",");
    expect(t.decimalComma).toBe(false);
    expect(t.columns).toEqual([{ index: 0, name: "T", unitText: "K" }, { index: 1, name: "C", unitText: "mJ/K" }]);
    expect(t.headerLine).toBe(1);
    expect(Array.from(t.rows[0])).toEqual([1.5, 2.5]);
    expect(Array.from(t.rows[1])).toEqual([2.25, 0.3]);
    expect(Array.from(t.lineNumbers)).toEqual([2, 3]);
    expect(t.rows[0]).toBeInstanceOf(Float64Array);
    expect(t.fileName).toBe("cu.csv");
    expect(t.issues).toEqual([]);
  });

  it("parseDelimited detects semicolons with decimal commas", () => {
    const t = parseDelimited("T;C\n1,234;5,67\n2,5;6\n");
    expect([t.delimiter, t.decimalComma]).toEqual([";", true]);
    expect(Array.from(t.rows[0])).toEqual([1.234, 2.5]);
    expect(Array.from(t.rows[1])).toEqual([5.67, 6]);
  });

  it("parseDelimited keeps semicolon integers as decimal-point data when no comma appears", () => {
    const t = parseDelimited("1;2\n3;4\n");
    expect([t.delimiter, t.decimalComma, t.headerLine]).toEqual([";", false, undefined]);
    expect(t.columns.map((c) => c.name)).toEqual(["column 1", "column 2"]);
  });

  it("parseDelimited detects tabs and whitespace, and prefers tab when both fit", () => {
    expect(parseDelimited("1.0\t2.0\n3.0\t4.0\n").delimiter).toBe("\t");
    expect(parseDelimited("  1.0   2.0  3\n 3.0 4.0 5\n").delimiter).toBe("whitespace");
    expect(col("1.0  \t 2.0\n3.0 4.0\n", 1)).toEqual([2, 4]);
  });

  it("parseDelimited reads tab data with decimal commas", () => {
    expect(col("1,5\t2,5\n3,5\t4,5\n", 1)).toEqual([2.5, 4.5]);
  });

  it("parseDelimited honours an explicit delimiter and decimal mark", () => {
    const t = parseDelimited("1;2;3\n1,5;2;3\n", { delimiter: ";", decimalComma: false });
    expect(t.issues[0]).toMatchObject({ line: 2, column: 1, message: 'not a number: "1,5"' });
  });

  it("parseDelimited refuses a decimal comma with the comma delimiter", () => {
    expect(() => parseDelimited("1,2\n", { delimiter: ",", decimalComma: true })).toThrow(InputError);
  });

  it("parseDelimited keeps an instrument preamble and comment lines out of the data", () => {
    const text = [
      "Heat capacity export v2", "Sample: Nb0.75Mo0.25, mass 12.3 mg", "Date: 2024-05-01",
      "# comment", "", "Temperature (K),Samp HC (µJ/K),Samp HC Err (µJ/K)",
      "1.9,10.5,0.2", "% mid-file comment", "// another", "2.1,11.0,0.2", "",
    ].join("\n");
    const t = parseDelimited(text);
    expect(t.preamble).toEqual(["Heat capacity export v2", "Sample: Nb0.75Mo0.25, mass 12.3 mg", "Date: 2024-05-01", "# comment"]);
    expect(t.headerLine).toBe(6);
    expect(t.columns.map((c) => c.unitText)).toEqual(["K", "µJ/K", "µJ/K"]);
    expect(Array.from(t.lineNumbers)).toEqual([7, 10]);
  });

  it("parseDelimited treats ';' as a comment only when it is not the delimiter", () => {
    expect(parseDelimited("; note\n1 2\n3 4\n").preamble).toEqual(["; note"]);
    expect(parseDelimited("1;2\n;3\n").issues).toEqual([{ line: 2, column: 1, field: "column 1", message: "empty cell" }]);
  });

  it("parseDelimited reads a name row followed by a unit row", () => {
    const t = parseDelimited("T,C,sigma\nK,J/(mol K),[J/(mol K)]\n1,2,0.1\n");
    expect(t.columns.map((c) => [c.name, c.unitText])).toEqual([["T", "K"], ["C", "J/(mol K)"], ["sigma", "J/(mol K)"]]);
    expect([t.headerLine, t.unitLine]).toEqual([1, 2]);
  });

  it("parseDelimited does not take a name row for a unit row", () => {
    const t = parseDelimited("Sample;Cu\nT;C\n1;2\n");
    expect(t.columns.map((c) => c.name)).toEqual(["T", "C"]);
    expect(t.preamble).toEqual(["Sample;Cu"]);
  });

  it("parseDelimited reads a commented header line", () => {
    const t = parseDelimited("# T(K)  C(J/K)\n1 2\n3 4\n");
    expect(t.columns).toEqual([{ index: 0, name: "T", unitText: "K" }, { index: 1, name: "C", unitText: "J/K" }]);
  });

  it("parseDelimited reads whitespace headers whose names contain spaces", () => {
    expect(parseDelimited("Temperature (K)   Heat capacity (J/K)\n1 2\n").columns.map((c) => c.name)).toEqual(["Temperature", "Heat capacity"]);
    expect(parseDelimited("T (K) C (J/K)\n1 2\n").columns.map((c) => c.unitText)).toEqual(["K", "J/K"]);
  });

  it("parseDelimited reads quoted cells with delimiters and doubled quotes inside", () => {
    const t = parseDelimited('"T, sample (K)","C ""raw"" (J/K)"\n"1.5","2.5"\n3,4\n');
    expect(t.columns.map((c) => c.name)).toEqual(["T, sample", 'C "raw"']);
    expect(Array.from(t.rows[1])).toEqual([2.5, 4]);
  });

  it("parseDelimited ignores one trailing delimiter per line", () => {
    const t = parseDelimited("T,C,\n1,2,\n3,4,\n");
    expect(t.columns.length).toBe(2);
    expect(t.issues).toEqual([]);
  });

  it("parseDelimited reports bad, NaN and empty cells and wrong cell counts with line, column and name", () => {
    const t = parseDelimited("T\tHC (J/mol-K)\n1\t2\n3\tNaN\n4\t\n5\tx1\n6\n7\t8\t9\n");
    expect(t.issues).toEqual([
      { line: 3, column: 2, field: "HC", message: "cell is NaN" },
      { line: 4, column: 2, field: "HC", message: "empty cell" },
      { line: 5, column: 2, field: "HC", message: 'not a number: "x1"' },
      { line: 6, column: 2, field: "HC", message: "expected 2 cells, found 1" },
      { line: 7, column: 3, field: undefined, message: "expected 2 cells, found 3" },
    ]);
    expect(Array.from(t.rows[1])).toEqual([2, NaN, NaN, NaN, NaN, 8]);
    expect(t.issueCount).toBe(5);
  });

  it("parseDelimited skips a line without numbers after the data with an issue", () => {
    const t = parseDelimited("1,2\nEND OF DATA\n3,4\n");
    expect(t.rowCount).toBe(2);
    expect(t.issues).toEqual([{ line: 2, column: 1, message: "skipped a line without numbers" }]);
  });

  it("parseDelimited throws InputError for text without two numeric columns", () => {
    for (const text of ["", "\n\n", "hello\nworld", "1\n2\n3\n", "# 1,2\n"]) {
      expect(() => parseDelimited(text, { fileName: "x.txt" })).toThrow(/no numeric data found.*x\.txt/);
    }
  });

  it("parseDelimited reads 100 000 rows exactly", () => {
    const lines = ["T (K),C (J/K)"];
    for (let i = 1; i <= 100_000; i++) lines.push(`${(i * 0.001).toFixed(3)},${(i * 1e-6).toExponential(6)}`);
    const t = parseDelimited(lines.join("\n"));
    expect(t.rowCount).toBe(100_000);
    expect(t.rows[0][99_999]).toBe(100);
    expect(t.rows[1][0]).toBe(1e-6);
    expect(t.lineNumbers[99_999]).toBe(100_001);
  });
});

describe("parseDelimited with text columns", () => {
  it("parseDelimited accepts a text column such as a time stamp beside the numbers", () => {
    const t = parseDelimited("Time,T (K),C (J/K)\n2024-05-01 12:00:00,1.5,2.5\n2024-05-01 12:01:00,1.6,2.6\n");
    expect(t.delimiter).toBe(",");
    expect(Array.from(t.rows[1])).toEqual([1.5, 1.6]);
    expect(t.issues.map((i) => [i.line, i.column, i.field])).toEqual([[2, 1, "Time"], [3, 1, "Time"]]);
  });

  it("parseDelimited prefers whitespace with decimal commas over a comma split that leaves text cells", () => {
    const t = parseDelimited("1,5 2,5\n3,5 4,5\n");
    expect([t.delimiter, t.decimalComma]).toEqual(["whitespace", true]);
  });
});
