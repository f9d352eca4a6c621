/**
 * Cost model: capital items (shell, platforms and ladders, trays, solvent pump and motor, blower)
 * escalated by the cost-index ratio, installed by factors and annualised by the capital recovery
 * factor; operating items per year (solvent, pump and blower electricity, lost product, emission
 * charge). Total annualised cost (TAC) = annualised capital + operating. Pure, SI, no I/O.
 *
 * Caution: capital costs from published correlations are study estimates (typically ±30 % or
 * wider); the shell thickness used for the shell mass is a preliminary estimate, the vessel must be
 * designed to the local pressure-vessel code by a licensed engineer.
 */
import type { CostBasisData, CostCurveData } from '../../../shared/schemas/costBasis.ts'
import { costItemLabels, type CapitalItemKey, type CostItemKey, type OperatingItemKey } from '../../../shared/costItems.ts'
import type { DesignResult, DesignSummary, EngineWarning } from '../contract.ts'
import {
  capitalRecoveryFactor,
  costFromCurve,
  platformsCost,
  trayCountFactor,
} from './correlations.ts'
import { vesselShell } from '../vessel/shell.ts'

const G = 9.80665 // m/s2, standard gravity
const ATM = 101325 // Pa
const SECONDS_PER_HOUR = 3600 // operating hours (cost basis) x 3600 s = seconds of flow in SI

export {
  capitalItemKeys,
  operatingItemKeys,
  costItemLabels,
  type CapitalItemKey,
  type OperatingItemKey,
  type CostItemKey,
} from '../../../shared/costItems.ts'

export interface CapitalItem {
  key: CapitalItemKey
  label: string
  size: number // in the correlation's own unit
  sizeUnit: string
  purchased: number // currency at the basis's target index
  installed: number // purchased × installation factor
  annual: number // installed × contingency × CRF, per year
}

export interface OperatingItem {
  key: OperatingItemKey
  label: string
  quantity: number // per year, in quantityUnit
  quantityUnit: string
  annual: number // per year
}

export interface CostBreakdown {
  currency: string
  costIndex: number
  capitalRecoveryFactor: number // 1/yr
  purchasedCapital: number
  installedCapital: number // incl. contingency factor
  annualisedCapital: number // per year
  operatingCost: number // per year
  totalAnnualCost: number // per year
  soluteRecoveredPerYear: number // kg/yr
  costPerKgRecovered: number // currency/kg (TAC / solute recovered); Infinity-free: 0 when nothing recovered
  /** Annual amount per item (capital items annualised), currency/yr. */
  annual: Record<CostItemKey, number>
  capital: CapitalItem[]
  operating: OperatingItem[]
  power: { pumpHydraulic: number; pumpShaft: number; pumpElectric: number; blowerAir: number; blowerShaft: number; blowerElectric: number; pumpHead: number; blowerPressureRise: number } // W, W, W, W, W, W, m, Pa
  shell: { thickness: number; mass: number; designPressure: number } // m, kg, Pa gauge
  warnings: EngineWarning[]
}

function curveWarn(
  warnings: EngineWarning[] | null,
  key: string,
  S: number,
  curve: CostCurveData,
): void {
  if (warnings && (S < curve.sizeMin || S > curve.sizeMax)) {
    warnings.push({
      code: 'costOutsideValidity',
      path: `correlations.${key}`,
      message: `${costItemLabels[key as CostItemKey] ?? key}: size ${S.toPrecision(4)} ${curve.sizeUnit} lies outside the correlation's range ${curve.sizeMin}–${curve.sizeMax} ${curve.sizeUnit}; the cost is extrapolated.`,
    })
  }
}

/**
 * Price a design with a site cost basis.
 *
 * @param s      the design summary in SI (flows in m3/s and kg/s; a stored, public summary goes
 *               through summaryToSI in shared/summaryUnits.ts first)
 * @param basis  the site cost basis
 * @returns      capital and operating items, TAC (currency/yr) and cost per kg of solute recovered
 */
export function costDesign(s: DesignSummary, basis: CostBasisData): CostBreakdown {
  return computeCost(s, basis, [])
}

/** The total annualised cost only, without warnings or item lists (the optimiser's fast path). */
export function totalAnnualCost(s: DesignSummary, basis: CostBasisData): number {
  return computeCost(s, basis, null)
}

function computeCost(s: DesignSummary, basis: CostBasisData, warnings: EngineWarning[]): CostBreakdown
function computeCost(s: DesignSummary, basis: CostBasisData, warnings: null): number
function computeCost(s: DesignSummary, basis: CostBasisData, warnings: EngineWarning[] | null): CostBreakdown | number {
  const g = basis.general
  const I = g.targetIndex
  const cap = basis.capital
  const cor = basis.correlations
  const mat = basis.materials
  const drv = basis.drives
  const hours = g.operatingHours

  const D = s.selectedDiameter
  const H = s.columnHeight

  // --- shell: thickness and mass, from the one vessel model (vessel/shell.ts). 'design' prices the
  // shell the design shows; 'costBasis' runs the same model with the cost basis's material data.
  const designPressure = Math.max(s.designPressure, mat.minimumDesignPressure)
  let thickness: number
  let mass: number
  if (mat.shellMassSource === 'design') {
    thickness = s.shellThickness
    mass = s.shellMass
  } else {
    const v = vesselShell(
      {
        designPressure,
        allowableStress: mat.allowableStress,
        jointEfficiency: mat.jointEfficiency,
        corrosionAllowance: mat.corrosionAllowance,
        materialDensity: mat.shellDensity,
        minimumThickness: mat.minimumThickness,
      },
      D,
      H,
    )
    thickness = v.thickness
    mass = v.mass
    if (warnings) {
      if (!v.thinWallValid) warnings.push({ code: 'thickWall', path: 'materials.allowableStress', message: 'The design pressure exceeds the thin-wall limit 0.385 S E: the shell thickness formula does not apply.' })
      if (Math.abs(mass - s.shellMass) > 0.005 * s.shellMass) {
        warnings.push({
          code: 'shellMassFromCostBasis',
          path: 'materials.shellMassSource',
          message: `The shell is priced at ${Math.round(mass)} kg, from the cost basis's material data, while the design shows ${Math.round(s.shellMass)} kg from the case's vessel data (same vessel model)`,
        })
      }
    }
  }
  const shellSizeSI = cor.shell.sizeBasis === 'mass' ? mass : (Math.PI / 4) * D * D * H
  const shellS = shellSizeSI * cor.shell.curve.sizeFactor
  curveWarn(warnings, 'shell', shellS, cor.shell.curve)
  const shellP = ((costFromCurve(shellSizeSI, cor.shell.curve) * cor.shell.materialFactor) * I) / cor.shell.curve.baseIndex

  // --- platforms and ladders
  const pl = cor.platforms
  const plP = (platformsCost(D, H, pl.multiplier, pl.diameterExponent, pl.heightExponent, pl.lengthFactor) * I) / pl.baseIndex
  if (warnings && pl.multiplier > 0) {
    const dft = D * pl.lengthFactor
    const hft = H * pl.lengthFactor
    if (dft < pl.diameterMin || dft > pl.diameterMax || hft < pl.heightMin || hft > pl.heightMax) {
      warnings.push({
        code: 'costOutsideValidity',
        path: 'correlations.platforms',
        message: `Platforms and ladders: D = ${dft.toPrecision(3)} ${pl.lengthUnit}, L = ${hft.toPrecision(3)} ${pl.lengthUnit} outside ${pl.diameterMin}–${pl.diameterMax} / ${pl.heightMin}–${pl.heightMax} ${pl.lengthUnit}; extrapolated.`,
      })
    }
  }

  // --- trays
  const tr = cor.trays
  const N = s.actualTrays
  const traySizeSI = tr.sizeBasis === 'diameter' ? D : (Math.PI / 4) * D * D
  const trayS = traySizeSI * tr.curve.sizeFactor
  curveWarn(warnings, 'trays', trayS, tr.curve)
  const FTM = tr.materialFactorConstant + (tr.sizeBasis === 'diameter' ? tr.materialFactorSlope * trayS : 0)
  const FNT = trayCountFactor(N, tr.countFactorForm, tr.countFactorCoefficients, tr.countFactorBelow)
  const trayP = (N * FNT * tr.typeFactor * FTM * costFromCurve(traySizeSI, tr.curve) * I) / tr.curve.baseIndex

  // --- solvent pump: head = column height + gauge pressure at the top + allowance
  const Qs = s.solventVolumetricFlow // m3/s
  const rhoL = s.solventVolumetricFlow > 0 ? s.solventMassFlow / s.solventVolumetricFlow : 1000
  const gaugeHead = Math.max(0, s.operatingPressure - ATM) / (rhoL * G)
  const head = H + gaugeHead + drv.pumpHeadAllowance // m
  const pumpHydraulic = rhoL * G * Qs * head // W
  const pumpBrake = pumpHydraulic / drv.pumpEfficiency
  const pumpElectric = pumpBrake / drv.motorEfficiency
  const pu = cor.pump
  const pumpSizeSI = pu.sizeBasis === 'flowHead' ? Qs * Math.sqrt(head) : pumpBrake
  const pumpS = pumpSizeSI * pu.curve.sizeFactor
  let pumpP = 0
  if (Qs > 0) {
    curveWarn(warnings, 'pump', pumpS, pu.curve)
    pumpP = (pu.typeFactor * pu.materialFactor * costFromCurve(pumpSizeSI, pu.curve) * I) / pu.curve.baseIndex
  }
  let motorP = 0
  const mo = cor.motor
  const motorS = pumpElectric * mo.curve.sizeFactor
  if (mo.included && pumpElectric > 0) {
    curveWarn(warnings, 'motor', motorS, mo.curve)
    motorP = (mo.typeFactor * costFromCurve(pumpElectric, mo.curve) * I) / mo.curve.baseIndex
  }

  // --- blower: gas volumetric flow × (column pressure drop + allowance)
  const dP = s.columnPressureDrop + drv.blowerPressureAllowance
  const blowerAir = s.gasVolumetricFlow * dP // W
  const blowerBrake = blowerAir / drv.blowerEfficiency
  const blowerElectric = blowerBrake / drv.blowerMotorEfficiency
  const bl = cor.blower
  const blowerSizeSI = bl.sizeBasis === 'power' ? blowerElectric : s.gasVolumetricFlow
  const blowerS = blowerSizeSI * bl.curve.sizeFactor
  let blowerP = 0
  if (blowerSizeSI > 0) {
    curveWarn(warnings, 'blower', blowerS, bl.curve)
    blowerP = (bl.materialFactor * costFromCurve(blowerSizeSI, bl.curve) * I) / bl.curve.baseIndex
  }

  // --- installed and annualised capital
  const f = cap.installationFactors
  const crf = capitalRecoveryFactor(cap.interestRate, cap.economicLife)
  const k = cap.contingencyFactor * crf
  const inst = {
    shell: shellP * f.shell,
    platforms: plP * f.platforms,
    trays: trayP * f.trays,
    pump: pumpP * f.pump,
    motor: motorP * f.motor,
    blower: blowerP * f.blower,
  }
  const purchasedCapital = shellP + plP + trayP + pumpP + motorP + blowerP
  const installedBare = inst.shell + inst.platforms + inst.trays + inst.pump + inst.motor + inst.blower
  const installedCapital = installedBare * cap.contingencyFactor

  // --- operating, per year
  const u = basis.utilities
  const solventM3 = s.solventVolumetricFlow * SECONDS_PER_HOUR * hours
  const pumpKWh = (pumpElectric / 1000) * hours
  const blowerKWh = (blowerElectric / 1000) * hours
  const lostKg = s.soluteLost * SECONDS_PER_HOUR * hours
  const op = {
    solvent: solventM3 * u.solventCost,
    pumpElectricity: pumpKWh * u.electricityPrice,
    blowerElectricity: blowerKWh * u.electricityPrice,
    lostProduct: lostKg * u.productValue,
    emissionCharge: lostKg * u.emissionCharge,
  }
  const operatingCost = op.solvent + op.pumpElectricity + op.blowerElectricity + op.lostProduct + op.emissionCharge
  const annualisedCapital = installedCapital * crf
  const totalAnnualCost = annualisedCapital + operatingCost
  const recoveredKg = s.soluteAbsorbed * SECONDS_PER_HOUR * hours
  if (!warnings) return totalAnnualCost

  const annual: Record<CostItemKey, number> = {
    shell: inst.shell * k,
    platforms: inst.platforms * k,
    trays: inst.trays * k,
    pump: inst.pump * k,
    motor: inst.motor * k,
    blower: inst.blower * k,
    ...op,
  }

  const capital: CapitalItem[] = [
    { key: 'shell', label: costItemLabels.shell, size: shellS, sizeUnit: cor.shell.curve.sizeUnit, purchased: shellP, installed: inst.shell, annual: annual.shell },
    { key: 'platforms', label: costItemLabels.platforms, size: D * pl.lengthFactor, sizeUnit: pl.lengthUnit, purchased: plP, installed: inst.platforms, annual: annual.platforms },
    { key: 'trays', label: costItemLabels.trays, size: trayS, sizeUnit: tr.curve.sizeUnit, purchased: trayP, installed: inst.trays, annual: annual.trays },
    { key: 'pump', label: costItemLabels.pump, size: pumpS, sizeUnit: pu.curve.sizeUnit, purchased: pumpP, installed: inst.pump, annual: annual.pump },
    { key: 'motor', label: costItemLabels.motor, size: motorS, sizeUnit: mo.curve.sizeUnit, purchased: motorP, installed: inst.motor, annual: annual.motor },
    { key: 'blower', label: costItemLabels.blower, size: blowerS, sizeUnit: bl.curve.sizeUnit, purchased: blowerP, installed: inst.blower, annual: annual.blower },
  ]
  const operating: OperatingItem[] = [
    { key: 'solvent', label: costItemLabels.solvent, quantity: solventM3, quantityUnit: 'm3/yr', annual: op.solvent },
    { key: 'pumpElectricity', label: costItemLabels.pumpElectricity, quantity: pumpKWh, quantityUnit: 'kWh/yr', annual: op.pumpElectricity },
    { key: 'blowerElectricity', label: costItemLabels.blowerElectricity, quantity: blowerKWh, quantityUnit: 'kWh/yr', annual: op.blowerElectricity },
    { key: 'lostProduct', label: costItemLabels.lostProduct, quantity: lostKg, quantityUnit: 'kg/yr', annual: op.lostProduct },
    { key: 'emissionCharge', label: costItemLabels.emissionCharge, quantity: lostKg, quantityUnit: 'kg/yr', annual: op.emissionCharge },
  ]

  return {
    currency: g.currency,
    costIndex: I,
    capitalRecoveryFactor: crf,
    purchasedCapital,
    installedCapital,
    annualisedCapital,
    operatingCost,
    totalAnnualCost,
    soluteRecoveredPerYear: recoveredKg,
    costPerKgRecovered: recoveredKg > 0 ? totalAnnualCost / recoveredKg : 0,
    annual,
    capital,
    operating,
    power: { pumpHydraulic, pumpShaft: pumpBrake, pumpElectric, blowerAir, blowerShaft: blowerBrake, blowerElectric, pumpHead: head, blowerPressureRise: dP },
    shell: { thickness, mass, designPressure },
    warnings,
  }
}

/** For the API and the command line: the TAC and its breakdown for a full design result. */
export function priceDesign(
  result: DesignResult,
  basis: CostBasisData,
): { totalAnnualCost: number; costBreakdown: CostBreakdown } {
  const costBreakdown = costDesign(result.summary, basis)
  return { totalAnnualCost: costBreakdown.totalAnnualCost, costBreakdown }
}
