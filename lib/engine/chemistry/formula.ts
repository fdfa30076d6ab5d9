/**
 * Chemical formulas of metals, alloys and compounds.
 *
 * Grammar (whitespace between tokens is ignored):
 *   formula := unit ( SEP count? unit )*        SEP is "·", "•", "⋅" or "*" (hydrate / adduct dot)
 *   unit    := group+
 *   group   := ( Element | "(" unit ")" | "[" unit "]" | "{" unit "}" ) count?
 *   count   := decimal number, e.g. 3, 0.75, .5, 6.95 (must be > 0)
 * Element symbols are case-sensitive (Co ≠ CO). A plain "." is NOT a separator: it is the
 * decimal mark of fractional subscripts (Nb0.75Mo0.25, YBa2Cu3O6.95), so write CuSO4·5H2O.
 */
import { InputError } from "../errors";
import { elementBySymbol } from "./elements";

export interface ElementAmount {
  symbol: string;
  /** Atoms of the element per formula unit. */
  amount: number;
}

export interface CompositionEntry {
  symbol: string;
  /** amount / atoms per formula unit. */
  atomFraction: number;
  /** amount × A_r / molar mass. */
  massFraction: number;
}

export interface ParsedFormula {
  formula: string;
  elements: ElementAmount[];
  atomsPerFormulaUnit: number;
  /** M = Σ amount × A_r [g/mol]. */
  molarMassGPerMol: number;
  /** √Σ (amount × u)² from the abridged ± values; undefined when an element has no standard atomic weight. */
  molarMassUncertainty?: number;
  composition: CompositionEntry[];
  warnings: string[];
  source: string;
}

const SEPARATORS = "·•⋅*";
const OPEN: Record<string, string> = { "(": ")", "[": "]", "{": "}" };

class Reader {
  i = 0;
  constructor(readonly text: string) {}
  fail(why: string, at = this.i): never {
    throw new InputError(`invalid formula: ${JSON.stringify(this.text)} (${why} at column ${at + 1})`, { column: at + 1, field: "formula" });
  }
  skipSpace(): void {
    while (this.i < this.text.length && /\s/.test(this.text[this.i])) this.i++;
  }
  peek(): string {
    this.skipSpace();
    return this.text[this.i] ?? "";
  }
  count(): number | null {
    this.skipSpace();
    const m = /^(\d+\.?\d*|\.\d+)/.exec(this.text.slice(this.i));
    if (!m) return null;
    const at = this.i;
    this.i += m[0].length;
    const n = Number(m[0]);
    if (!(n > 0)) this.fail(`count must be > 0, found ${m[0]}`, at);
    return n;
  }
}

type Counts = Map<string, number>;

function add(into: Counts, from: Counts, factor: number): void {
  for (const [s, n] of from) into.set(s, (into.get(s) ?? 0) + n * factor);
}

function readUnit(r: Reader, close: string | null): Counts {
  const counts: Counts = new Map();
  for (;;) {
    const c = r.peek();
    if (c === "" || SEPARATORS.includes(c) || c === close) break;
    const start = r.i;
    let group: Counts;
    if (OPEN[c]) {
      r.i++;
      group = readUnit(r, OPEN[c]);
      if (r.peek() !== OPEN[c]) r.fail(`missing "${OPEN[c]}" to close the "${c}" of column ${start + 1}`);
      r.i++;
      if (group.size === 0) r.fail(`empty "${c}${OPEN[c]}"`, start);
    } else if (/[A-Z]/.test(c)) {
      group = new Map([[readSymbol(r), 1]]);
    } else if (/[)\]}]/.test(c)) {
      r.fail(`unexpected "${c}"`);
    } else if (/[\d.]/.test(c)) {
      r.fail(`a count must follow an element or a bracket, found "${c}"`);
    } else {
      r.fail(/[a-z]/.test(c) ? `element symbols start with a capital letter, found "${c}"` : `unexpected character "${c}"`);
    }
    add(counts, group, r.count() ?? 1);
  }
  return counts;
}

function readSymbol(r: Reader): string {
  const at = r.i;
  const two = r.text.slice(at, at + 2);
  if (/^[A-Z][a-z]$/.test(two)) {
    if (elementBySymbol(two)) { r.i += 2; return two; }
    r.fail(`unknown element "${two}"`, at);
  }
  if (elementBySymbol(r.text[at])) { r.i += 1; return r.text[at]; }
  return r.fail(`unknown element "${r.text[at]}"`, at);
}

/** Parse the text into merged element counts per formula unit (order of first appearance). */
export function parseElementCounts(text: string): ElementAmount[] {
  if (typeof text !== "string" || text.trim() === "") throw new InputError("invalid formula: empty", { field: "formula" });
  const r = new Reader(text);
  const total: Counts = new Map();
  for (let first = true; ; first = false) {
    if (!first) r.i++; // the separator
    const factor = first ? 1 : r.count() ?? 1;
    const unit = readUnit(r, null);
    if (unit.size === 0) r.fail(first ? "no element" : "nothing after the separator");
    add(total, unit, factor);
    const c = r.peek();
    if (c === "") break;
    if (!SEPARATORS.includes(c)) r.fail(`unexpected "${c}"`);
  }
  return [...total].map(([symbol, amount]) => ({ symbol, amount }));
}
