/**
 * Tray state at the selected diameter: geometry, heads, weeping, entrainment and the downcomer at
 * both ends and at turndown.
 *
 * Source: benitez2009 ch. 4 (dry tray, clear liquid after bennett1983, residual head, hole Froude
 * number, entrainment); treybal1980 ch. 6 (apron loss, weeping velocity eq. 6.46); sinnott2005
 * (Francis weir, backup limit, residence time).
 */
import type { CaseSI } from '../case.ts'
import type { EngineWarning } from '../contract.ts'
import { G_ACC } from '../properties/constants.ts'
import {
  clearLiquidCoefficient,
  clearLiquidHeight,
  downcomerEntranceLoss,
  dryTrayHead,
  entrainmentBenitez,
  frothDensity,
  holeFroudeNumber,
  orificeCoefficient,
  residualHead,
  weirCrestFrancis,
  weirLengthRatio,
  weepVelocityTreybal,
} from '../hydraulics/tray.ts'
import type { EndSizing, EndStreams, Sizing } from './sizing.ts'
import { memoLast1 } from '../numerics/memo.ts'

/** The weir length ratio (a Newton solve with sines) is the same for every design at the minimum downcomer fraction. */
const weirLengthRatioOf = memoLast1(weirLengthRatio)
const clearLiquidCoefficientOf = memoLast1(clearLiquidCoefficient)

export interface TrayHydraulics {
  vo: number
  va: number
  Ks: number
  phiE: number
  hL: number
  hd: number
  hSigma: number
  ht: number
  dP: number
  Fr: number
  entrainment: number // kg liquid / kg gas
  psi: number // fractional entrainment e/(L+e)
  how: number
  h2: number
  backup: number
  backupLimit: number
  residence: number
  fractionFlood: number
}

export interface TrayGeometry {
  AdAt: number
  At: number
  Ad: number
  An: number
  Aa: number
  Ah: number
  Lw: number
  Co: number
}

/** What the heads of a tray need: the installed areas and the tray and liquid data (SI). */
export interface HeadsGeometry {
  Ad: number // m2
  Aa: number // m2
  Ah: number // m2
  AhAa: number // -
  Lw: number // m
  Co: number // -, orifice coefficient
  t: number // m, tray spacing
  hw: number // m, weir height
  clearance: number // m, apron clearance under the downcomer
  dO: number // m, hole diameter
  rhoL: number // kg/m3
  sigma: number // N/m
  /** coefficient of the clear-liquid height for this weir height, when computed once for the column */
  Cl?: number
}

/** The heads and checks' values of one column end (all of TrayHydraulics but the fraction of flood). */
export type TrayHeads = Omit<TrayHydraulics, 'fractionFlood'>

/**
 * Heads, weeping, entrainment and downcomer of one column end at a tray geometry: the one
 * calculation the design (at the selected diameter) and the rating (at the as-built areas) share.
 * Equations: h_t = h_d + h_L + h_sigma, dP = h_t g rho_L; Fr_h = [rho_V v_o^2/(rho_L g h_L)]^0.5;
 *   backup = h_w + h_ow + h_t + h_2 <= (t + h_w)/2; residence = A_d backup / q_L (the correlations
 *   and their sources in hydraulics/tray.ts). Fills `out` field by field when given (no allocation).
 */
export function trayHeads<T extends TrayHeads>(s: EndStreams, g: HeadsGeometry, out: T): T {
  const vo = s.Q / g.Ah
  const va = s.Q / g.Aa
  const Ks = va * Math.sqrt(s.rhoV / (g.rhoL - s.rhoV))
  const phiE = frothDensity(Ks)
  const hL = clearLiquidHeight(phiE, g.hw, s.qL, g.Lw, g.Cl)
  const hd = dryTrayHead(vo, g.Co, s.rhoV, g.rhoL, g.AhAa)
  const hSigma = residualHead(g.sigma, g.rhoL, g.dO)
  const ht = hd + hL + hSigma
  const E = entrainmentBenitez(hL, g.dO, phiE, Ks, g.AhAa, g.t, g.rhoL, s.rhoV)
  const eMass = E * s.gasMass
  const how = weirCrestFrancis(s.qL, g.Lw)
  const Ada = Math.min(g.Lw * g.clearance, g.Ad)
  const h2 = downcomerEntranceLoss(s.qL, Ada)
  const backup = g.hw + how + ht + h2
  out.vo = vo
  out.va = va
  out.Ks = Ks
  out.phiE = phiE
  out.hL = hL
  out.hd = hd
  out.hSigma = hSigma
  out.ht = ht
  out.dP = ht * G_ACC * g.rhoL
  out.Fr = holeFroudeNumber(s.rhoV, vo, g.rhoL, hL)
  out.entrainment = E
  out.psi = eMass / (s.liqMass + eMass)
  out.how = how
  out.h2 = h2
  out.backup = backup
  out.backupLimit = 0.5 * (g.t + g.hw)
  out.residence = (g.Ad * backup) / s.qL
  return out
}

function trayHydraulics(s: EndStreams, sz: EndSizing, g: TrayGeometry, hg: HeadsGeometry): TrayHydraulics {
  const h = trayHeads(s, hg, {} as TrayHydraulics)
  h.fractionFlood = s.Q / g.An / sz.vF
  return h
}

export interface TrayState {
  geometry: TrayGeometry
  bottom: TrayHydraulics
  top: TrayHydraulics
  /** the whole tray at turndown; null when only the check was asked for (see trayState) */
  turndown: TrayHydraulics | null
  /** hole Froude number at turndown (the check) */
  turndownFr: number
  turndownFraction: number
  /** Treybal eq. 6.46 weeping hole velocity [m/s]; 0 when the gas viscosity is unknown or the detail was not asked for */
  weepV: number
  /** liquid flow path across the tray [m] */
  Zflow: number
}

/**
 * The hole Froude number of one end: the first heads of trayHeads (the same operations, so the
 * same number) without the entrainment and the downcomer.
 */
function froudeAt(s: EndStreams, g: HeadsGeometry): number {
  const vo = s.Q / g.Ah
  const va = s.Q / g.Aa
  const Ks = va * Math.sqrt(s.rhoV / (g.rhoL - s.rhoV))
  const phiE = frothDensity(Ks)
  const hL = clearLiquidHeight(phiE, g.hw, s.qL, g.Lw, g.Cl)
  return holeFroudeNumber(s.rhoV, vo, g.rhoL, hL)
}

/**
 * The tray at the selected diameter, both ends and turndown. Without `detail` (the optimiser's
 * lean designs) only the Froude number at turndown, which the check needs, is computed: not the
 * rest of the turndown tray nor the second weeping method, which only the detail shows.
 */
export function trayState(c: CaseSI, sz: Sizing, bot: EndStreams, top: EndStreams, warnings: EngineWarning[], detail = true): TrayState {
  const tr = c.tray
  const D = sz.Dsel
  const AdAt = Math.max(sz.sBot.AdAt, sz.sTop.AdAt)
  const At = 0.25 * Math.PI * D * D
  const Ad = AdAt * At
  const An = At - Ad
  const Aa = At - 2 * Ad
  const Ah = sz.AhAa * Aa
  const Lw = weirLengthRatioOf(AdAt) * D
  const Co = orificeCoefficient(tr.holeDiameter, tr.thickness)
  if (tr.holeDiameter / tr.thickness < 1) {
    warnings.push({ code: 'outsideValidity', message: 'Orifice coefficient: the hole diameter is smaller than the plate thickness, outside the chart the fit comes from; the dry-tray head is extrapolated', path: 'tray.thickness' })
  }
  const geometry: TrayGeometry = { AdAt, At, Ad, An, Aa, Ah, Lw, Co }
  const hg: HeadsGeometry = { Ad, Aa, Ah, AhAa: sz.AhAa, Lw, Co, t: sz.t, hw: tr.weirHeight, clearance: tr.downcomerClearance, dO: tr.holeDiameter, rhoL: c.solvent.density, sigma: c.solvent.surfaceTension, Cl: clearLiquidCoefficientOf(tr.weirHeight) }
  const hBot = trayHydraulics(bot, sz.sBot, geometry, hg)
  const hTop = trayHydraulics(top, sz.sTop, geometry, hg)
  // turndown: the lowest gas rate at design liquid rate, at the end that weeps first
  const tdf = tr.turndownFraction
  const topWeepsFirst = hTop.Fr <= hBot.Fr
  const sLow = topWeepsFirst ? top : bot
  const turn: EndStreams = { gasMol: sLow.gasMol * tdf, gasMass: sLow.gasMass * tdf, rhoV: sLow.rhoV, Q: sLow.Q * tdf, liqMass: sLow.liqMass, qL: sLow.qL }
  const hTurn = detail ? trayHydraulics(turn, topWeepsFirst ? sz.sTop : sz.sBot, geometry, hg) : null
  const turndownFr = hTurn ? hTurn.Fr : froudeAt(turn, hg)
  // second weeping method (Treybal eq. 6.46), when the gas viscosity is known
  const lwRatio = Lw / D
  const Zflow = D * Math.sqrt(1 - lwRatio * lwRatio)
  const weepV = detail && c.gas.viscosity ? weepVelocityTreybal(c.gas.viscosity, c.solvent.surfaceTension, top.rhoV, c.solvent.density, tr.holeDiameter, tr.thickness, Aa, tr.holePitch, Zflow) : 0
  return { geometry, bottom: hBot, top: hTop, turndown: hTurn, turndownFr, turndownFraction: tdf, weepV, Zflow }
}
