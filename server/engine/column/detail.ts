/**
 * The detail section of a design result (SI, molar flows in mol/s) and its checksum: the sum of
 * its numbers, read field by field from typed objects (a generic walk over the tree costs as much
 * as a fifth of a design). The guard uses it to find a non-finite number in the detail.
 */
import type { ReferenceKey } from '../references.ts'
import type { EndSizing, EndStreams } from './sizing.ts'
import type { TrayHydraulics } from './trays.ts'

export type DesignDetail = {
  units: string
  references: readonly ReferenceKey[]
  equilibrium: { model: string; temperature: number; pressure: number; K0: number; Ktop: number; Kbottom: number; xStarBottom: number; parameters: Record<string, number | string> | null }
  balances: {
    method: string
    methodNote: string
    straightness: number
    straightnessTolerance: number
    inletGas: number
    outletGas: number
    leanSolvent: number
    richSolvent: number
    solventFreeGas: number
    solventFreeSolvent: number
    minimumSolventSlope: number
    operatingSlope: number
    pinchX: number
    tangentPinch: boolean
    absorptionFactorTop: number
    absorptionFactorBottom: number
    soluteAbsorbed: number
    theoreticalStages: number
    lastStageFraction: number
    lastStageConvention: string
  }
  efficiency: { model: string; overallEfficiency: number; Kmean: number; traysRequired: number; trays: number; entrainmentCorrectedEfficiency: number }
  hydraulics: {
    designEnd: 'bottom' | 'top'
    spacingIterations: number
    fractionOfFloodTarget: number
    fractionOfFloodAchieved: number
    surfaceTensionFactor: number
    foamingFactor: number
    holeAreaFactor: number
    orificeCoefficient: number
    activeArea: number
    holeArea: number
    downcomerArea: number
    towerArea: number
    netArea: number
    weirLength: number
    bottom: { streams: EndStreams; sizing: EndSizing; tray: TrayHydraulics }
    top: { streams: EndStreams; sizing: EndSizing; tray: TrayHydraulics }
    turndown: { fraction: number; tray: TrayHydraulics }
    weepHoleVelocityTreybal: number
    liquidFlowDistance: number
  }
  vessel: { designPressure: number; thicknessCalculated: number; thicknessMinimum: number; thickness: number; mass: number; height: number }
}

const streamsSum = (s: EndStreams): number => s.gasMol + s.gasMass + s.rhoV + s.Q + s.liqMass + s.qL
const sizingSum = (s: EndSizing): number => s.FLV + s.CF + s.C + s.vF + s.AdAt + s.D
const traySum = (h: TrayHydraulics): number =>
  h.vo + h.va + h.Ks + h.phiE + h.hL + h.hd + h.hSigma + h.ht + h.dP + h.Fr + h.entrainment + h.psi + h.how + h.h2 + h.backup + h.backupLimit + h.residence + h.fractionFlood

function parametersSum(p: Record<string, number | string> | null): number {
  if (!p) return 0
  let s = 0
  for (const k in p) {
    const v = p[k]
    if (typeof v === 'number') s += v
  }
  return s
}

/** The sum of every number in the detail (non-finite when one of them is). */
export function detailChecksum(d: DesignDetail): number {
  const e = d.equilibrium
  const b = d.balances
  const f = d.efficiency
  const h = d.hydraulics
  const v = d.vessel
  return (
    e.temperature + e.pressure + e.K0 + e.Ktop + e.Kbottom + e.xStarBottom + parametersSum(e.parameters) +
    b.straightness + b.straightnessTolerance + b.inletGas + b.outletGas + b.leanSolvent + b.richSolvent + b.solventFreeGas + b.solventFreeSolvent +
    b.minimumSolventSlope + b.operatingSlope + b.pinchX + b.absorptionFactorTop + b.absorptionFactorBottom + b.soluteAbsorbed + b.theoreticalStages + b.lastStageFraction +
    f.overallEfficiency + f.Kmean + f.traysRequired + f.trays + f.entrainmentCorrectedEfficiency +
    h.spacingIterations + h.fractionOfFloodTarget + h.fractionOfFloodAchieved + h.surfaceTensionFactor + h.foamingFactor + h.holeAreaFactor + h.orificeCoefficient +
    h.activeArea + h.holeArea + h.downcomerArea + h.towerArea + h.netArea + h.weirLength +
    streamsSum(h.bottom.streams) + sizingSum(h.bottom.sizing) + traySum(h.bottom.tray) +
    streamsSum(h.top.streams) + sizingSum(h.top.sizing) + traySum(h.top.tray) +
    h.turndown.fraction + traySum(h.turndown.tray) + h.weepHoleVelocityTreybal + h.liquidFlowDistance +
    v.designPressure + v.thicknessCalculated + v.thicknessMinimum + v.thickness + v.mass + v.height
  )
}
