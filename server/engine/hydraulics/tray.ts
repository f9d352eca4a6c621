/**
 * Sieve-tray hydraulics: pressure drop, weeping, entrainment, downcomer.
 * All heads in metres of clear liquid.
 */
import { G_ACC } from '../properties/constants.ts'
import type { ValidityRange } from '../numerics/validity.ts'

/**
 * Orifice coefficient of sieve-tray holes (fit of the Liebson, Kelley & Bullington chart).
 * Equation: C_o = 0.85032 - 0.04231 (d_o/l) + 0.0017954 (d_o/l)^2
 * @param dO hole diameter [m]; @param l plate thickness [m]
 * Validity: d_o/l >= 1 (and up to about 12 in the chart).
 * Source: liebson1957 via benitez2009 ch. 4 (Illus. 4.7). Example: orificeCoefficient(0.0045, 0.002) = 0.76421 (d_o/l = 2.25)
 */
export function orificeCoefficient(dO: number, l: number): number {
  const r = dO / l
  return 0.85032 - 0.04231 * r + 0.0017954 * r * r
}
export const orificeCoefficientValidity: ValidityRange = { arg: 'd_o/l', min: 1, max: 12, unit: '-' }

/**
 * Dry-tray head.
 * Published form: h_d[cm] = 0.0051 (v_o/C_o)^2 rho_V (rho_w/rho_L) (1 - (A_h/A_a)^2), rho_w = 1000
 * SI form used: h_d[m] = (v_o/C_o)^2 rho_V / (2 g rho_L) (1 - (A_h/A_a)^2)   (0.0051 ~ 100/(2 g 1000))
 * @param vo hole velocity [m/s]; @param Co orifice coefficient [-]
 * @param rhoV, rhoL densities [kg/m3]; @param AhAa hole/active area [-]
 * Source: benitez2009 ch. 4 (Illus. 4.7). Example: dryTrayHead(10, 0.75, 1.2, 1000, 0.1) = 0.010768 m
 */
export function dryTrayHead(vo: number, Co: number, rhoV: number, rhoL: number, AhAa: number): number {
  const r = vo / Co
  return ((r * r * rhoV) / (2 * G_ACC * rhoL)) * (1 - AhAa * AhAa)
}

/**
 * Relative froth density.
 * Equation: phi_e = exp(-12.55 K_s^0.91), K_s = v_a [rho_V/(rho_L - rho_V)]^0.5 (active area)
 * Source: bennett1983 via benitez2009 ch. 4. Example: frothDensity(0.05) = 0.43969
 */
export function frothDensity(Ks: number): number {
  return Math.exp(-12.55 * Math.pow(Ks, 0.91))
}

/**
 * Clear-liquid height on the tray (Bennett et al. 1983).
 * Equation: h_L = phi_e [h_w + C (q_L/(L_w phi_e))^(2/3)], C = 0.5012 + 0.4389 exp(-137.8 h_w)  (SI, m)
 *   (published in cm: C_l = 50.12 + 43.89 exp(-1.378 h_w[cm]))
 * @param phiE froth density [-]; @param hw weir height [m]; @param qL liquid flow [m3/s]; @param Lw weir length [m]
 * Source: bennett1983 via benitez2009 ch. 4. Example: clearLiquidHeight(0.5, 0.05, 0.005, 1) = 0.03664 m
 */
export function clearLiquidHeight(phiE: number, hw: number, qL: number, Lw: number, C: number = clearLiquidCoefficient(hw)): number {
  const r = qL / (Lw * phiE)
  return phiE * (hw + C * Math.cbrt(r * r)) // r^(2/3) as a cube root: faster than pow, same value to rounding
}

/**
 * The coefficient C of the clear-liquid height: C = 0.5012 + 0.4389 exp(-137.8 h_w) (h_w in m); it
 * depends on the weir alone, so a design computes it once and passes it to clearLiquidHeight.
 * Source: bennett1983 via benitez2009 ch. 4. Example: clearLiquidCoefficient(0.05) = 0.50165
 */
export function clearLiquidCoefficient(hw: number): number {
  return 0.5012 + 0.4389 * Math.exp(-137.8 * hw)
}

/**
 * Residual (surface-tension) head. Equation: h_sigma = 6 sigma/(g rho_L d_o)
 * Source: benitez2009 ch. 4. Example: residualHead(0.07, 995, 0.0045) = 0.009565 m
 */
export function residualHead(sigma: number, rhoL: number, dO: number): number {
  return (6 * sigma) / (G_ACC * rhoL * dO)
}

/**
 * Weeping criterion (hole Froude number).
 * Equation: Fr_h = [rho_V v_o^2 / (rho_L g h_L)]^0.5; Fr_h >= 0.5: weeping not significant
 * Source: benitez2009 ch. 4 (Illus. 4.8). Example: holeFroudeNumber(1.8, 12, 995, 0.03) = 0.941
 */
export function holeFroudeNumber(rhoV: number, vo: number, rhoL: number, hL: number): number {
  return Math.sqrt((rhoV * vo * vo) / (rhoL * G_ACC * hL))
}
export const WEEP_FROUDE_LIMIT = 0.5

/**
 * Entrainment, kg liquid per kg gas (closed form of Benitez eqs 4.45-4.47).
 * Equations: k = 0.5 [1 - tanh(1.3 ln(h_L/d_o) - 0.15)]
 *   h_2phi = h_L/phi_e + 7.79 [1 + 6.9 (d_o/h_L)^1.85] K_s^2/(phi_e g A_h/A_a)
 *   E = 0.00335 (h_2phi/t)^1.1 (rho_L/rho_V)^0.5 (h_L/h_2phi)^k
 * @param hL clear liquid height [m]; @param dO hole diameter [m]; @param phiE froth density [-]
 * @param Ks capacity parameter on active area [m/s]; @param AhAa [-]; @param t spacing [m]
 * Source: benitez2009 eqs 4.45-4.47 (original author not named there).
 * Example: entrainmentBenitez(0.03, 0.0045, 0.4, 0.08, 0.1, 0.6, 995, 1.8) = 0.02669 kg/kg
 */
export function entrainmentBenitez(hL: number, dO: number, phiE: number, Ks: number, AhAa: number, t: number, rhoL: number, rhoV: number): number {
  const lnR = Math.log(hL / dO)
  const k = 0.5 * (1 - Math.tanh(1.3 * lnR - 0.15))
  // (d_o/h_L)^1.85 from the logarithm above: one exp instead of a pow
  const h2p = hL / phiE + (7.79 * (1 + 6.9 * Math.exp(-1.85 * lnR)) * Ks * Ks) / (phiE * G_ACC * AhAa)
  return 0.00335 * Math.pow(h2p / t, 1.1) * Math.sqrt(rhoL / rhoV) * Math.pow(hL / h2p, k)
}

/**
 * Weir crest (Francis). Published: h_ow[mm] = 750 [L_w/(rho_L l_w)]^(2/3), L_w kg/s, l_w m.
 * SI: h_ow[m] = 0.75 (q_L/l_w)^(2/3), q_L in m3/s.
 * Source: sinnott2005 sec. 11.13. Example: weirCrestFrancis(0.01, 0.8) = 0.04040 m (10 kg/s of water at 1000 kg/m3)
 */
export function weirCrestFrancis(qL: number, Lw: number): number {
  const r = qL / Lw
  return 0.75 * Math.cbrt(r * r) // r^(2/3)
}

/**
 * Downcomer entrance (apron) head loss.
 * Equation: h_2 = (3/(2g)) (q/A_da)^2, A_da the smaller of apron clearance area and A_d
 * Source: treybal1980 ch. 6 (Illus. 6.3). Example: downcomerEntranceLoss(0.005, 0.05) = 0.0015296 m
 */
export function downcomerEntranceLoss(qL: number, Ada: number): number {
  const v = qL / Ada
  return (3 / (2 * G_ACC)) * v * v
}

/**
 * Segmental downcomer geometry: chord angle theta from A_d/A_t = (theta - sin theta)/(2 pi),
 * weir length L_w = D sin(theta/2). Source: benitez2009 ch. 4. Example: weirLengthRatio(0.1) = 0.7266
 */
export function weirLengthRatio(AdAt: number): number {
  // Newton on f(theta) = theta - sin(theta) - 2 pi AdAt
  const target = 2 * Math.PI * AdAt
  let th = Math.cbrt(6 * target) // small-angle start: theta^3/6 ~ target
  for (let i = 0; i < 30; i++) {
    const f = th - Math.sin(th) - target
    const df = 1 - Math.cos(th)
    const step = f / df
    th -= step
    if (Math.abs(step) < 1e-13) break
  }
  return Math.sin(th / 2)
}

// ---------------------------------------------------------------- Treybal set (second method)

/**
 * Dry-tray head, Treybal's form (second method, used as a cross-check).
 * Equation: 2 h_D g rho_L/(V_o^2 rho_G) = C_o [0.40 (1.25 - A_o/A_n) + 4 l f/d_o + (1 - A_o/A_n)^2],
 *   C_o = 1.09 (d_o/l)^0.25, Fanning f = 0.008
 * @param vo hole velocity [m/s]; @param dO hole diameter [m]; @param l plate thickness [m]
 * @param AoAn hole area / net area [-]; @param rhoV, rhoL densities [kg/m3]
 * @returns h_D [m of liquid]
 * Validity: d_o/l about 1-4 (Treybal ch. 6).
 * Source: treybal1980 ch. 6 (Illus. 6.3). Example: dryTrayHeadTreybal(15, 0.0045, 0.002, 0.113, 2, 995) = 0.0387 m
 */
export function dryTrayHeadTreybal(vo: number, dO: number, l: number, AoAn: number, rhoV: number, rhoL: number): number {
  const Co = 1.09 * Math.pow(dO / l, 0.25)
  const u = 1 - AoAn
  return ((Co * (0.4 * (1.25 - AoAn) + (4 * l * 0.008) / dO + u * u)) * vo * vo * rhoV) / (2 * G_ACC * rhoL)
}

/**
 * Liquid head on the tray, Treybal's form (second method).
 * Equation: h_L = 6.10e-3 + 0.725 h_w - 0.238 h_w V_a rho_G^0.5 + 1.225 q/z  [m], z = (D + W)/2
 * @param hw weir height [m]; @param va active-area gas velocity [m/s]; @param rhoV [kg/m3]
 * @param qL liquid flow [m3/s]; @param z average flow width [m]
 * Source: treybal1980 ch. 6 (Illus. 6.3). Example: liquidHeadTreybal(0.05, 1.5, 1.8, 0.005, 1) = 0.024527 m
 */
export function liquidHeadTreybal(hw: number, va: number, rhoV: number, qL: number, z: number): number {
  return 6.1e-3 + 0.725 * hw - 0.238 * hw * va * Math.sqrt(rhoV) + (1.225 * qL) / z
}

/**
 * Minimum hole velocity before weeping (Treybal eq. 6.46).
 * Equation: V_ow mu_G/sigma = 0.0229 [(mu_G^2/(sigma rho_G d_o)) (rho_L/rho_G)]^0.379 (l/d_o)^0.293
 *             [2 A_a d_o/(sqrt(3) p^3)]^(2.8/(Z/d_o)^0.724),  Z = 2 x (weir distance from the centre)
 * @param muV gas viscosity [Pa s]; @param sigma [N/m]; @param rhoV, rhoL [kg/m3]
 * @param dO hole diameter [m]; @param l plate thickness [m]; @param Aa active area [m2]
 * @param p hole pitch [m]; @param Z liquid flow distance [m]
 * @returns V_ow [m/s], hole velocity below which the tray weeps
 * Source: treybal1980 eq. 6.46.
 * Example: weepVelocityTreybal(1.5e-5, 0.07, 2, 995, 0.0045, 0.002, 1.32, 0.012, 1) = 5.079 m/s (CO2 over water)
 */
export function weepVelocityTreybal(muV: number, sigma: number, rhoV: number, rhoL: number, dO: number, l: number, Aa: number, p: number, Z: number): number {
  const g1 = Math.pow(((muV * muV) / (sigma * rhoV * dO)) * (rhoL / rhoV), 0.379)
  const g2 = Math.pow(l / dO, 0.293)
  const g3 = Math.pow((2 * Aa * dO) / (Math.sqrt(3) * p * p * p), 2.8 / Math.pow(Z / dO, 0.724))
  return (0.0229 * g1 * g2 * g3 * sigma) / muV
}
