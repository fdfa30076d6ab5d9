/**
 * Checks of a mapped temperature column that are not errors but must be seen before storing:
 * repeated temperatures and temperatures that do not increase from one row to the next
 * (a warm-up and a cool-down in one file, or rows out of order).
 */

/** One finding, with the 1-based source lines involved. */
export interface TemperatureFinding {
  line: number;
  /** The earlier line it is compared with. */
  otherLine: number;
  /** The temperature on `line`, in the file's unit. */
  value: number;
}

export interface TemperatureChecks {
  /** Rows whose temperature equals an earlier row's exactly (first 50). */
  duplicates: TemperatureFinding[];
  duplicateCount: number;
  /** Rows whose temperature is below the row before it (first 50). */
  decreasing: TemperatureFinding[];
  decreasingCount: number;
}

const KEEP = 50;

/**
 * Find repeated and non-increasing temperatures. `temperature` and `lineNumbers` are parallel
 * (one entry per accepted row); NaN entries are ignored. Throws RangeError on a length mismatch.
 */
export function checkTemperatures(temperature: ArrayLike<number>, lineNumbers: ArrayLike<number>): TemperatureChecks {
  if (temperature.length !== lineNumbers.length) throw new RangeError(`temperature has ${temperature.length} entries, lineNumbers ${lineNumbers.length}`);
  const firstLineOf = new Map<number, number>();
  const out: TemperatureChecks = { duplicates: [], duplicateCount: 0, decreasing: [], decreasingCount: 0 };
  let previous = NaN;
  let previousLine = 0;
  for (let i = 0; i < temperature.length; i++) {
    const t = temperature[i]!;
    const line = lineNumbers[i]!;
    if (Number.isNaN(t)) continue;
    const seen = firstLineOf.get(t);
    if (seen !== undefined) {
      out.duplicateCount++;
      if (out.duplicates.length < KEEP) out.duplicates.push({ line, otherLine: seen, value: t });
    } else firstLineOf.set(t, line);
    if (t < previous) {
      out.decreasingCount++;
      if (out.decreasing.length < KEEP) out.decreasing.push({ line, otherLine: previousLine, value: t });
    }
    previous = t;
    previousLine = line;
  }
  return out;
}
