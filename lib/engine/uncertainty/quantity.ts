/**
 * The shared result type of every derived quantity: a value with its standard error
 * (or null when none could be estimated), its unit and an optional note.
 */

export interface Quantity {
  /** Machine name, e.g. "thetaD". */
  readonly name: string;
  /** Display symbol, e.g. "Θ_D". */
  readonly symbol: string;
  readonly value: number;
  /** One standard error (1σ) in `unit`; null when not estimated. */
  readonly stdError: number | null;
  /** Unit of `value` and `stdError`, written out, e.g. "mJ mol^-1 K^-2". */
  readonly unit: string;
  readonly note?: string;
  /** Systematic standard uncertainty in `unit` (e.g. the window and model dependence of a fit), when one was estimated. */
  readonly systematicError?: number | null;
}

/**
 * The quantity with a systematic standard uncertainty added: `relative` × |value| (the
 * relative systematic uncertainty of what it was derived from). A non-finite or negative
 * relative uncertainty leaves it without one.
 */
export function withSystematic(q: Quantity, relative: number | null): Quantity {
  if (relative === null || !Number.isFinite(relative) || relative < 0) return q;
  return Object.freeze({ ...q, systematicError: Math.abs(q.value) * relative });
}

/**
 * Build a frozen Quantity. A non-finite stdError becomes null (no estimate); a negative one
 * is a programming error and throws RangeError.
 */
export function quantity(
  name: string,
  symbol: string,
  value: number,
  stdError: number | null,
  unit: string,
  note?: string,
): Quantity {
  if (stdError !== null && stdError < 0) throw new RangeError(`stdError of ${name} is negative: ${stdError}`);
  const err = stdError !== null && Number.isFinite(stdError) ? stdError : null;
  return Object.freeze(note === undefined ? { name, symbol, value, stdError: err, unit } : { name, symbol, value, stdError: err, unit, note });
}

/**
 * The same quantity in another unit: value and stdError multiplied by `factor`
 * (|factor| for the error). For display conversions such as J → mJ.
 */
export function scaleQuantity(q: Quantity, factor: number, unit: string): Quantity {
  return quantity(q.name, q.symbol, q.value * factor, q.stdError === null ? null : q.stdError * Math.abs(factor), unit, q.note);
}

/** Relative standard error |σ/value|, or null when σ is unknown or value is 0. */
export function relativeError(q: Quantity): number | null {
  if (q.stdError === null || q.value === 0) return null;
  return Math.abs(q.stdError / q.value);
}
