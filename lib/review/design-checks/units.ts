// Display conversions from model units (m, kN, kPa) to the units engineers read checks in.
/** kPa → MPa (N/mm²). */
export const toMPa = (kPa: number) => kPa / 1000;
/** m² → mm². */
export const toMm2 = (m2: number) => m2 * 1e6;
/** m → mm. */
export const toMm = (m: number) => m * 1000;
/** Round for display to a number of significant figures, keeping it a number (JSON friendly). */
export function sig(value: number, figures = 5): number {
  if (!Number.isFinite(value) || value === 0) return value;
  return Number(value.toPrecision(figures));
}
