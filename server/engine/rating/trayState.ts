/**
 * Sieve-tray hydraulics of a standing column: the flooding, pressure-drop, weeping,
 * entrainment and downcomer numbers of one column end at a fixed (as-built) geometry.
 *
 * The correlations are the design engine's leaf functions (hydraulics/flooding.ts,
 * hydraulics/tray.ts); here they are evaluated at the installed areas instead of at a
 * diameter sized for a fraction of flood.
 *
 * Areas (treybal1980 ch. 6; benitez2009 ch. 4): tower A_t = pi D^2/4, downcomer
 * A_d = (A_d/A_t) A_t, net A_n = A_t - A_d, active A_a = A_t - 2 A_d unless the as-built
 * active area (calming zones and supports deducted) is given, hole A_h = (A_h/A_a) A_a.
 */
import { capacityFactorFair, floodingVelocity, flowParameter } from '../hydraulics/flooding.ts'
import type { EndStreams } from '../column/sizing.ts'
import { trayHeads, type TrayHeads } from '../column/trays.ts'

/** The streams at one end of the column (SI): the design's own type. */
export type { EndStreams }

/** The installed tray geometry (SI) and the fixed property factors. */
export interface TrayGeometry {
  D: number // m
  t: number // m, tray spacing
  At: number // m2
  Ad: number // m2
  An: number // m2
  Aa: number // m2
  Ah: number // m2
  AhAa: number // -
  AdAt: number // -
  Lw: number // m
  hw: number // m, weir height
  clearance: number // m, apron clearance under the downcomer
  dO: number // m, hole diameter
  Co: number // -, orifice coefficient
  rhoL: number // kg/m3
  sigma: number // N/m
  /** F_ST F_F F_HA: surface tension, foaming and hole-area factors of the Fair capacity. */
  capacityFactors: number
}

/** The hydraulic state of one end at the geometry: the Fair flooding numbers, then the heads (m of clear liquid) as the design has them. */
export interface TrayState extends TrayHeads {
  FLV: number
  C: number // m/s, corrected capacity parameter
  vF: number // m/s, flooding velocity on the net area
  fractionFlood: number
}

/**
 * Hydraulic state of one column end at the installed geometry.
 *
 * Equations: F_LV = (L/G)(rho_V/rho_L)^0.5; C = C_F(t, F_LV) F_ST F_F F_HA;
 *   v_F = C [(rho_L - rho_V)/rho_V]^0.5; fraction of flood = (Q/A_n)/v_F;
 *   h_t = h_d + h_L + h_sigma, dP = h_t g rho_L; Fr_h = [rho_V v_o^2/(rho_L g h_L)]^0.5;
 *   backup = h_w + h_ow + h_t + h_2 <= (t + h_w)/2; residence = A_d backup / q_L.
 * @param s streams of the end [SI]; @param g installed geometry [SI]
 * Validity: as the leaf correlations (Fair: F_LV 0.01-1, t 0.15-0.9 m; holes <= 13 mm).
 * Source: fair1961 via treybal1980 ch. 6 (flooding, worked Illus. 6.3); bennett1983 and
 *   benitez2009 ch. 4 (clear liquid, dry tray, residual, entrainment, weeping);
 *   sinnott2005 (weir crest, backup limit); treybal1980 (apron loss).
 * Example: Treybal Illus. 6.3 streams (Q 3.0208 m3/s, rho_V 0.67928, q_L 5.0115e-3 m3/s,
 *   rho_L 961, sigma 0.040) on D 1.25 m, t 0.5 m, A_d/A_t 0.088 -> v_F 3.4177 m/s, 79.0 % of flood.
 */
export function trayStateAt(s: EndStreams, g: TrayGeometry, out?: TrayState): TrayState {
  const r = out ?? ({} as TrayState)
  const FLV = flowParameter(s.liqMass, s.gasMass, s.rhoV, g.rhoL)
  const C = capacityFactorFair(g.t, FLV) * g.capacityFactors
  const vF = C > 0 ? floodingVelocity(C, g.rhoL, s.rhoV) : 0
  r.FLV = FLV
  r.C = C
  r.vF = vF
  r.fractionFlood = vF > 0 ? s.Q / g.An / vF : Infinity
  // the heads, weeping, entrainment and downcomer: the design's own calculation (column/trays.ts)
  return trayHeads(s, g, r)
}

/** The same streams with the gas scaled by fG and the liquid by fL (compositions kept). */
export function scaleStreams(s: EndStreams, fG: number, fL: number, out?: EndStreams): EndStreams {
  const r = out ?? ({} as EndStreams)
  r.gasMol = s.gasMol * fG
  r.gasMass = s.gasMass * fG
  r.rhoV = s.rhoV
  r.Q = s.Q * fG
  r.liqMass = s.liqMass * fL
  r.qL = s.qL * fL
  return r
}
