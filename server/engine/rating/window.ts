/**
 * The operating window of a standing column: the region in gas flow against solvent flow
 * where the trays run inside every limit: flooding (percent flood), entrainment and
 * downcomer backup from above, weeping from below (common practice in tray rating; each
 * limit's correlation from treybal1980 ch. 6 and benitez2009 ch. 4, see trayState.ts).
 *
 * Basis: the stream compositions (gas and liquid densities, molar masses) of the rated
 * point are kept and the flows scaled; for the dilute gases the product treats, the
 * solute picked up changes the mass flows by a few per cent at most.
 *
 * Each boundary is found by bisection on the gas flow at a grid of solvent flows; a
 * boundary that lies beyond the searched gas range at a solvent flow has no point there.
 */
import type { OperatingWindow, WindowBoundaryKey, WindowPoint } from '../../../shared/schemas/rating.ts'
import { RATING_LIMITS } from './checks.ts'
import { scaleStreams, trayStateAt, type EndStreams, type TrayGeometry, type TrayState } from './trayState.ts'

const KMOLH = 3.6 // mol/s -> kmol/h
/** Gas flows searched, as multiples of the rated gas flow. */
const SCALE_LO = 0.01
const SCALE_HI = 20

export interface WindowOptions {
  /** Solvent flows to cover [kmol/h]; default 0.1-3 x the rated solvent flow. */
  solventFlowMin?: number
  solventFlowMax?: number
  /** Grid size (default 25). */
  points?: number
}

interface Probe {
  bot: EndStreams
  top: EndStreams
  sb: TrayState
  st: TrayState
}

/** Margin to each limit at gas scale fG and liquid scale fL: positive = inside. */
function margins(base: { bot: EndStreams; top: EndStreams }, g: TrayGeometry, fG: number, fL: number, p: Probe): Record<WindowBoundaryKey, number> {
  scaleStreams(base.bot, fG, fL, p.bot)
  scaleStreams(base.top, fG, fL, p.top)
  trayStateAt(p.bot, g, p.sb)
  trayStateAt(p.top, g, p.st)
  const L = RATING_LIMITS
  return {
    flooding: L.flood - Math.max(p.sb.fractionFlood, p.st.fractionFlood),
    entrainment: L.entrainment - Math.max(p.sb.psi, p.st.psi),
    weeping: Math.min(p.sb.Fr, p.st.Fr) - L.weepFroude,
    downcomerBackup: L.backupRatio - Math.max(p.sb.backup / p.sb.backupLimit, p.st.backup / p.st.backupLimit),
  }
}

const SIDES: Record<WindowBoundaryKey, { side: 'upper' | 'lower'; label: string; limit: string }> = {
  flooding: { side: 'upper', label: 'Flooding', limit: `${RATING_LIMITS.flood * 100} % of flood` },
  entrainment: { side: 'upper', label: 'Entrainment', limit: `fractional entrainment ${RATING_LIMITS.entrainment}` },
  weeping: { side: 'lower', label: 'Weeping', limit: `hole Froude number ${RATING_LIMITS.weepFroude}` },
  downcomerBackup: { side: 'upper', label: 'Downcomer backup', limit: 'backup = (tray spacing + weir height) / 2' },
}
const KEYS: WindowBoundaryKey[] = ['flooding', 'entrainment', 'weeping', 'downcomerBackup']

/**
 * Gas scale at which one limit is reached, at liquid scale fL, searched in [lo, hi].
 * The search starts at the rated gas rate (scale 1) and walks outward geometrically to the
 * first crossing, which bisection then refines: the crossing nearest the rated point, never a
 * spurious one far outside the correlations' ranges (at very low gas rates the flow parameter
 * leaves the Fair chart; at very high ones the froth correlations lose meaning).
 * Returns null when the limit is not crossed in the range; for an upper limit already passed
 * over the whole range, lo.
 */
function crossing(key: WindowBoundaryKey, base: { bot: EndStreams; top: EndStreams }, g: TrayGeometry, fL: number, lo: number, hi: number, p: Probe): number | null {
  const inside = (fG: number) => {
    const v = margins(base, g, fG, fL, p)[key]
    return v >= 0 // NaN (a correlation outside its range) counts as outside
  }
  const upper = SIDES[key].side === 'upper'
  const step = 1.5
  const start = Math.min(Math.max(1, lo), hi)
  const in0 = inside(start)
  // direction of the walk: towards the limit
  const up = upper ? in0 : !in0
  let x = start
  let a: number // inside
  let b: number // outside
  for (;;) {
    const y = up ? x * step : x / step
    if (y > hi || y < lo) {
      if (upper && !in0) return lo // beyond the upper limit all the way down
      return null
    }
    if (inside(y) !== in0) {
      a = in0 ? x : y
      b = in0 ? y : x
      break
    }
    x = y
  }
  let la = Math.log(a)
  let lb = Math.log(b)
  for (let i = 0; i < 32; i++) {
    const mid = 0.5 * (la + lb)
    if (inside(Math.exp(mid))) la = mid
    else lb = mid
  }
  return Math.exp(0.5 * (la + lb))
}

/**
 * Gas scale (relative to the rated streams) at which one limit is reached at liquid scale fL.
 * @returns the scale, or null when not reached between 0.01 and 20 x the rated gas flow
 */
export function limitGasScale(key: WindowBoundaryKey, bot: EndStreams, top: EndStreams, g: TrayGeometry, fL = 1): number | null {
  const p: Probe = { bot: { ...bot }, top: { ...top }, sb: {} as TrayState, st: {} as TrayState }
  return crossing(key, { bot, top }, g, fL, SCALE_LO, SCALE_HI, p)
}

/**
 * Operating window around a rated point.
 * @param bot, top the rated streams at the two ends [SI]
 * @param gasFlow, solventFlow the rated flows [kmol/h]
 */
export function operatingWindow(bot: EndStreams, top: EndStreams, g: TrayGeometry, gasFlow: number, solventFlow: number, opts?: WindowOptions): OperatingWindow {
  const n = Math.max(5, Math.min(201, Math.round(opts?.points ?? 25)))
  const lmin = opts?.solventFlowMin !== undefined && opts.solventFlowMin > 0 ? opts.solventFlowMin : 0.1 * solventFlow
  const lmax = opts?.solventFlowMax !== undefined && opts.solventFlowMax > lmin ? opts.solventFlowMax : Math.max(3 * solventFlow, 1.2 * lmin)
  const p: Probe = { bot: { ...bot }, top: { ...top }, sb: {} as TrayState, st: {} as TrayState }
  const base = { bot, top }
  const pts: Record<WindowBoundaryKey, WindowPoint[]> = { flooding: [], entrainment: [], weeping: [], downcomerBackup: [] }
  const region: OperatingWindow['region'] = []
  const LO = SCALE_LO
  const HI = SCALE_HI
  for (let i = 0; i < n; i++) {
    const L = lmin + ((lmax - lmin) * i) / (n - 1)
    const fL = L / solventFlow
    let gMax = HI * gasFlow
    let gMin = 0
    for (const k of KEYS) {
      const s = crossing(k, base, g, fL, LO, HI, p)
      if (s === null) continue
      const G = s * gasFlow
      pts[k].push({ solventFlow: L, gasFlow: G })
      if (SIDES[k].side === 'upper') gMax = Math.min(gMax, G)
      else gMin = Math.max(gMin, G)
    }
    if (gMax > gMin && gMax < HI * gasFlow) region.push({ solventFlow: L, gasFlowMin: gMin, gasFlowMax: gMax })
  }
  const here = margins(base, g, 1, 1, p)
  const violated = KEYS.filter((k) => here[k] < 0)
  let gTop = gasFlow
  for (const r of region) if (r.gasFlowMax > gTop) gTop = r.gasFlowMax
  gTop *= 1.15
  return {
    boundaries: KEYS.map((k) => ({ key: k, label: SIDES[k].label, side: SIDES[k].side, limit: SIDES[k].limit, points: pts[k] })),
    region,
    current: { solventFlow, gasFlow },
    inside: violated.length === 0,
    violated,
    solventFlowRange: [lmin, lmax],
    gasFlowRange: [0, gTop],
    basis: 'Stream compositions of the rated point, flows scaled; each limit is the corresponding tray check\'s limit.',
  }
}

export { KMOLH }
