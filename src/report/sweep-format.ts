// Number and unit text shared by the sweep's printed tables and its report page.

/** A sensitivity per unit with four significant digits, or in exponent form when very small or large; '' where there is none. */
export function perUnit(value: number | null): string {
  if (value === null || !Number.isFinite(value)) return '';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  return magnitude >= 0.01 && magnitude < 1e5
    ? value.toFixed(Math.max(0, 4 - Math.floor(Math.log10(magnitude)) - 1))
    : value.toExponential(3);
}

/** 'massKg, kg', or the field alone for a dimensionless one (unit '1' or none). */
export function fieldWithUnit(field: string, unit: string | undefined): string {
  return unit && unit !== '1' ? `${field}, ${unit}` : field;
}

/** '620 kg', or the value alone for a dimensionless field. */
export function valueWithUnit(value: number, unit: string | undefined): string {
  return unit && unit !== '1' ? `${value} ${unit}` : String(value);
}
