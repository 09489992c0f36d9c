// JSON for people and scripts alike: numbers rounded to what the inputs can support (an accelerometer or a GPS
// speed is good to three or four decimals), not the 17 digits of a double. Integers pass unchanged.

/** Four decimals at 0.01 and above; four significant digits below, so a small coefficient does not become 0. */
export function jsonNumber(value: number): number {
  if (!Number.isFinite(value) || Number.isInteger(value)) return value;
  const rounded = Math.abs(value) >= 0.01 ? Math.round(value * 1e4) / 1e4 : Number(value.toPrecision(4));
  return rounded === 0 ? 0 : rounded;
}

/** JSON.stringify with every number rounded by jsonNumber, indented by two spaces, with a final newline. */
export function roundedJson(value: unknown): string {
  return JSON.stringify(value, (_key, item: unknown) => (typeof item === 'number' ? jsonNumber(item) : item), 2) + '\n';
}

/** A copy of a plain record (objects, arrays, numbers, strings) with every number rounded by jsonNumber. */
export function roundedNumbers<T>(value: T): T {
  if (typeof value === 'number') return jsonNumber(value) as T;
  if (Array.isArray(value)) return value.map((item: unknown) => roundedNumbers(item)) as T;
  if (typeof value === 'object' && value !== null)
    return Object.fromEntries(Object.entries(value).map(([key, item]) => [key, roundedNumbers(item)])) as T;
  return value;
}
