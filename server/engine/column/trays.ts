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

function trayHydraulics(s: EndStreams, sz: EndSizing, t: number, c: CaseSI, g: TrayGeometry, AhAa: number, Cl: number): TrayHydraulics {
  const tr = c.tray
  const rhoL = c.solvent.density
  const vo = s.Q / g.Ah
  const va = s.Q / g.Aa
  const Ks = va * Math.sqrt(s.rhoV / (rhoL - s.rhoV))
  const phiE = frothDensity(Ks)
  const hL = clearLiquidHeight(phiE, tr.weirHeight, s.qL, g.Lw, Cl)
  const hd = dryTrayHead(vo, g.Co, s.rhoV, rhoL, AhAa)
  const hSigma = residualHead(c.solvent.surfaceTension, rhoL, tr.holeDiameter)
  const ht = hd + hL + hSigma
  const dP = ht * G_ACC * rhoL
  const Fr = holeFroudeNumber(s.rhoV, vo, rhoL, hL)
  const E = entrainmentBenitez(hL, tr.holeDiameter, phiE, Ks, AhAa, t, rhoL, s.rhoV)
  const eMass = E * s.gasMass
  const psi = eMass / (s.liqMass + eMass)
  const how = weirCrestFrancis(s.qL, g.Lw)
  const Ada = Math.min(g.Lw * tr.downcomerClearance, g.Ad)
  const h2 = downcomerEntranceLoss(s.qL, Ada)
  const backup = tr.weirHeight + how + ht + h2
  const backupLimit = 0.5 * (t + tr.weirHeight)
  const residence = (g.Ad * backup) / s.qL
  const fractionFlood = s.Q / g.An / sz.vF
  return { vo, va, Ks, phiE, hL, hd, hSigma, ht, dP, Fr, entrainment: E, psi, how, h2, backup, backupLimit, residence, fractionFlood }
}

export interface TrayState {
  geometry: TrayGeometry
  bottom: TrayHydraulics
  top: TrayHydraulics
  turndown: TrayHydraulics
  turndownFraction: number
  /** Treybal eq. 6.46 weeping hole velocity [m/s]; 0 when the gas viscosity is unknown */
  weepV: number
  /** liquid flow path across the tray [m] */
  Zflow: number
}

/** The tray at the selected diameter, both ends and turndown. */
export function trayState(c: CaseSI, sz: Sizing, bot: EndStreams, top: EndStreams, warnings: EngineWarning[]): TrayState {
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
  const Cl = clearLiquidCoefficientOf(tr.weirHeight)
  const hBot = trayHydraulics(bot, sz.sBot, sz.t, c, geometry, sz.AhAa, Cl)
  const hTop = trayHydraulics(top, sz.sTop, sz.t, c, geometry, sz.AhAa, Cl)
  // turndown: the lowest gas rate at design liquid rate, at the end that weeps first
  const tdf = tr.turndownFraction
  const topWeepsFirst = hTop.Fr <= hBot.Fr
  const sLow = topWeepsFirst ? top : bot
  const turn: EndStreams = { gasMol: sLow.gasMol * tdf, gasMass: sLow.gasMass * tdf, rhoV: sLow.rhoV, Q: sLow.Q * tdf, liqMass: sLow.liqMass, qL: sLow.qL }
  const hTurn = trayHydraulics(turn, topWeepsFirst ? sz.sTop : sz.sBot, sz.t, c, geometry, sz.AhAa, Cl)
  // second weeping method (Treybal eq. 6.46), when the gas viscosity is known
  const lwRatio = Lw / D
  const Zflow = D * Math.sqrt(1 - lwRatio * lwRatio)
  const weepV = c.gas.viscosity ? weepVelocityTreybal(c.gas.viscosity, c.solvent.surfaceTension, top.rhoV, c.solvent.density, tr.holeDiameter, tr.thickness, Aa, tr.holePitch, Zflow) : 0
  return { geometry, bottom: hBot, top: hTop, turndown: hTurn, turndownFraction: tdf, weepV, Zflow }
}
