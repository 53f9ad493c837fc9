/** Two-sided 95% normal quantile, z = Φ⁻¹(0.975). */
const Z95 = 1.959963984540054;

/**
 * The Wilson score interval for `germinated` of `sown` (Wilson 1927, J. Am. Stat. Assoc.
 * 22:209–212), as fractions 0–1. It stays inside 0–1 and behaves at 0% and 100% and at the
 * small counts of a home test, where the plain ±z·√(p(1−p)/n) interval does not.
 */
export function wilsonInterval(germinated: number, sown: number, z = Z95): { low: number; high: number } {
  if (sown <= 0) return { low: 0, high: 1 };
  const p = germinated / sown;
  const z2 = z * z;
  const denominator = 1 + z2 / sown;
  const centre = (p + z2 / (2 * sown)) / denominator;
  const half = (z / denominator) * Math.sqrt((p * (1 - p)) / sown + z2 / (4 * sown * sown));
  // At 0 and at n the algebra gives exactly 0 and 1; rounding should not move them.
  return { low: germinated === 0 ? 0 : centre - half, high: germinated === sown ? 1 : centre + half };
}
