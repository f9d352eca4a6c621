/**
 * Kremser (absorption-factor) equations for dilute systems with straight operating
 * and equilibrium lines. A = L/(K V).
 */

const A_ONE_TOL = 1e-7

/**
 * Fraction of the absorbable solute absorbed in N ideal stages.
 *
 * Equation: (y_{N+1} - y_1)/(y_{N+1} - K x_0) = (A^{N+1} - A)/(A^{N+1} - 1);
 *   at A = 1: N/(N+1)
 * @param A absorption factor [-]
 * @param N ideal stages [-] (real, >= 0)
 * Validity: dilute, constant A.
 * Source: kremser1930 (as in benitez2009, Illus. 5.1).
 * Example: fractionAbsorbedKremser(1.4, 5) = 0.938740
 */
export function fractionAbsorbedKremser(A: number, N: number): number {
  if (Math.abs(A - 1) < A_ONE_TOL) return N / (N + 1)
  const AN1 = Math.pow(A, N + 1)
  return (AN1 - A) / (AN1 - 1)
}

/**
 * Ideal stages for a given approach, with lean-solvent loading.
 *
 * Equation: N = ln[ ((y_{N+1} - K x0)/(y_1 - K x0)) (1 - 1/A) + 1/A ] / ln A;
 *   at A = 1: N = (y_{N+1} - y_1)/(y_1 - K x0)
 * @param yIn gas inlet mole fraction y_{N+1} [-]
 * @param yOut gas outlet mole fraction y_1 [-]
 * @param Kx0 K x0, gas in equilibrium with the lean solvent [-]
 * @param A absorption factor [-]
 * @returns N [-]; Infinity when the target cannot be reached (A <= fraction)
 * Validity: yOut > K x0; dilute.
 * Source: kremser1930 (form of benitez2009, Illus. 5.1).
 * Example: stagesKremser(1, 0.05, 0, 1.4) = 5.5302 (phi = 0.05)
 */
export function stagesKremser(yIn: number, yOut: number, Kx0: number, A: number): number {
  const ratio = (yIn - Kx0) / (yOut - Kx0)
  if (Math.abs(A - 1) < A_ONE_TOL) {
    // series around A = 1 would add O(A-1) terms; the A = 1 limit is exact to ~1e-7
    return ratio - 1
  }
  const arg = ratio * (1 - 1 / A) + 1 / A
  if (arg <= 0) return Infinity
  const N = Math.log(arg) / Math.log(A)
  return N > 0 ? N : 0
}

/**
 * Stages from the fraction not absorbed phi (x0 = 0).
 * Equation: N = ln(1 + (A - 1)/phi)/ln A - 1
 * Source: kremser1930 (fraction-not-absorbed form). Example: stagesFromUnabsorbedKremser(1.4, 0.05) = 5.5302
 */
export function stagesFromUnabsorbedKremser(A: number, phi: number): number {
  return stagesKremser(1, phi, 0, A)
}
