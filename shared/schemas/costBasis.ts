/**
 * Site cost basis: the unit prices, financial terms, materials and capital-cost correlation
 * coefficients an economist keeps per site. Every field is editable; presets in
 * data/cost-presets/ fill them from published sources.
 *
 * Units: SI for physical quantities (m, Pa, kg/m3, h/yr). Money is in `general.currency` at the
 * cost index `general.targetIndex`. Each capital-cost correlation keeps its published units and
 * coefficients; `sizeFactor` converts the SI size the product computes into the correlation's
 * own size unit (e.g. kg -> lb is 2.20462).
 *
 * The client renders grouped forms from `costBasisFieldMeta` (field path -> label, unit, help).
 */
import { z } from 'zod'
import type { PriceKind, QuantityKind } from '../units.ts'

const pos = () => z.number().positive()
const nonneg = () => z.number().nonnegative()
const fraction = () => z.number().gt(0).lte(1)

/**
 * A purchased-cost curve of the general form
 *   C = a * B^( c0 + c1*L + c2*L^2 + c3*L^3 + c4*L^4 + b*S ),  L = log_B(S),
 * with S the size in the correlation's own unit (S = SI size * sizeFactor) and B = e or 10.
 * This holds the common published forms: ln C = c0 + c1 ln S + c2 (ln S)^2 (a = 1, b = 0),
 * log10 C = K1 + K2 log10 S + K3 (log10 S)^2 (a = 1, b = 0, base 10), and C = a exp(b S)
 * (coefficients [0]).
 */
export const costCurveSchema = z.object({
  logBase: z.enum(['e', '10']),
  multiplier: pos(),
  coefficients: z.array(z.number()).min(1).max(5),
  linearCoefficient: z.number(),
  sizeUnit: z.string().min(1),
  sizeFactor: pos(),
  sizeMin: nonneg(),
  sizeMax: pos(),
  baseIndex: pos(),
  baseYear: z.string().min(1),
  source: z.string().min(1),
})
export type CostCurveData = z.infer<typeof costCurveSchema>

export const costBasisSchema = z.object({
  name: z.string().min(1).max(200),
  description: z.string().max(4000).default(''),
  general: z.object({
    currency: z.string().min(1).max(8),
    indexName: z.string().min(1).max(80),
    targetIndex: pos(),
    targetYear: z.string().min(1).max(40),
    operatingHours: z.number().positive().max(8784),
  }),
  utilities: z.object({
    electricityPrice: nonneg(),
    solventCost: nonneg(),
    productValue: nonneg(),
    emissionCharge: nonneg().default(0),
  }),
  capital: z.object({
    interestRate: z.number().gt(0).lt(1),
    economicLife: z.number().int().min(1).max(100),
    installationFactors: z.object({
      shell: pos(),
      platforms: pos(),
      trays: pos(),
      pump: pos(),
      motor: pos(),
      blower: pos(),
    }),
    contingencyFactor: pos().default(1),
  }),
  drives: z.object({
    pumpEfficiency: fraction(),
    motorEfficiency: fraction(),
    blowerEfficiency: fraction(),
    blowerMotorEfficiency: fraction(),
    pumpHeadAllowance: nonneg(),
    blowerPressureAllowance: nonneg(),
  }),
  materials: z.object({
    shellMassSource: z.enum(['costBasis', 'design']),
    shellDensity: pos(),
    allowableStress: pos(),
    jointEfficiency: fraction(),
    corrosionAllowance: nonneg(),
    minimumDesignPressure: nonneg(),
    minimumThickness: z
      .array(z.object({ maxDiameter: pos(), thickness: pos() }))
      .min(1)
      .max(20),
  }),
  correlations: z.object({
    shell: z.object({
      sizeBasis: z.enum(['mass', 'volume']),
      curve: costCurveSchema,
      materialFactor: pos(),
      headsAllowance: nonneg(),
    }),
    platforms: z.object({
      multiplier: nonneg(),
      diameterExponent: z.number(),
      heightExponent: z.number(),
      lengthUnit: z.string().min(1),
      lengthFactor: pos(),
      diameterMin: nonneg(),
      diameterMax: pos(),
      heightMin: nonneg(),
      heightMax: pos(),
      baseIndex: pos(),
      baseYear: z.string().min(1),
      source: z.string().min(1),
    }),
    trays: z.object({
      sizeBasis: z.enum(['diameter', 'area']),
      curve: costCurveSchema,
      typeFactor: pos(),
      materialFactorConstant: pos(),
      materialFactorSlope: nonneg(),
      countFactorForm: z.enum(['geometric', 'logPolynomial10', 'none']),
      countFactorCoefficients: z.array(z.number()).min(1).max(4),
      countFactorBelow: z.number().int().min(1).max(200),
    }),
    pump: z.object({
      sizeBasis: z.enum(['flowHead', 'shaftPower']),
      curve: costCurveSchema,
      typeFactor: pos(),
      materialFactor: pos(),
    }),
    motor: z.object({
      included: z.boolean(),
      curve: costCurveSchema,
      typeFactor: pos(),
    }),
    blower: z.object({
      sizeBasis: z.enum(['power', 'volumetricFlow']),
      curve: costCurveSchema,
      materialFactor: pos(),
      includesDrive: z.boolean(),
    }),
  }),
  sources: z.array(z.string()).default([]),
})

export type CostBasisData = z.infer<typeof costBasisSchema>
export type CostBasisInput = z.input<typeof costBasisSchema>

export { capitalItemKeys, operatingItemKeys, costItemLabels, type CapitalItemKey, type OperatingItemKey, type CostItemKey } from '../costItems.ts'
export interface FieldMeta {
  label: string
  unit: string
  help: string
}

const curveMeta = (prefix: string, what: string): Record<string, FieldMeta> => ({
  [`${prefix}.logBase`]: { label: `${what}: logarithm base`, unit: '-', help: "'e' for ln-form correlations, '10' for log10-form." },
  [`${prefix}.multiplier`]: { label: `${what}: multiplier a`, unit: 'currency', help: 'Leading factor a in C = a·B^(polynomial).' },
  [`${prefix}.coefficients`]: { label: `${what}: coefficients c0..c4`, unit: '-', help: 'Polynomial in log_B(S), constant term first.' },
  [`${prefix}.linearCoefficient`]: { label: `${what}: linear size coefficient b`, unit: '1/size unit', help: 'Coefficient of S itself in the exponent (e.g. C = a·exp(b·D)).' },
  [`${prefix}.sizeUnit`]: { label: `${what}: size unit`, unit: '-', help: 'Unit of the size S in the published correlation.' },
  [`${prefix}.sizeFactor`]: { label: `${what}: size conversion`, unit: 'size unit per SI unit', help: 'S = SI size × this factor.' },
  [`${prefix}.sizeMin`]: { label: `${what}: validity minimum`, unit: 'size unit', help: 'Below this the cost is extrapolated and a warning is shown.' },
  [`${prefix}.sizeMax`]: { label: `${what}: validity maximum`, unit: 'size unit', help: 'Above this the cost is extrapolated and a warning is shown.' },
  [`${prefix}.baseIndex`]: { label: `${what}: cost index of the correlation`, unit: '-', help: 'Cost index (e.g. CEPCI) at which the correlation was published.' },
  [`${prefix}.baseYear`]: { label: `${what}: base year`, unit: '-', help: 'Year or date of that index.' },
  [`${prefix}.source`]: { label: `${what}: source`, unit: '-', help: 'Published source of the correlation.' },
})

/** Labels, units and help per field path, for grouped forms. */
export const costBasisFieldMeta: Record<string, FieldMeta> = {
  name: { label: 'Name', unit: '-', help: 'Name of this cost basis.' },
  description: { label: 'Description', unit: '-', help: 'Notes on where the numbers come from.' },
  general: { label: 'General', unit: '', help: '' },
  'general.currency': { label: 'Currency', unit: '-', help: 'ISO code, e.g. USD.' },
  'general.indexName': { label: 'Cost index', unit: '-', help: 'Name of the cost index, e.g. CEPCI.' },
  'general.targetIndex': { label: 'Cost index of this basis', unit: '-', help: 'Index value for the year costs are wanted in; correlations are escalated by targetIndex / baseIndex.' },
  'general.targetYear': { label: 'Cost year', unit: '-', help: 'Year (or month) of the target index.' },
  'general.operatingHours': { label: 'Operating hours', unit: 'h/yr', help: 'Hours per year the absorber runs.' },
  utilities: { label: 'Utilities and values', unit: '', help: '' },
  'utilities.electricityPrice': { label: 'Electricity price', unit: 'currency/kWh', help: 'Delivered price of electricity.' },
  'utilities.solventCost': { label: 'Solvent make-up or treatment', unit: 'currency/m3', help: 'Cost of the solvent fed, per volume (supply plus treatment or disposal of the rich solvent).' },
  'utilities.productValue': { label: 'Product value', unit: 'currency/kg', help: 'Value of the solute recovered, per mass; lost solute is charged at this value.' },
  'utilities.emissionCharge': { label: 'Emission charge', unit: 'currency/kg', help: 'Charge or levy per mass of solute released with the cleaned gas (0 if none).' },
  capital: { label: 'Capital and annualisation', unit: '', help: '' },
  'capital.interestRate': { label: 'Interest rate', unit: '1/yr (fraction)', help: 'Rate for the capital recovery factor, e.g. 0.10.' },
  'capital.economicLife': { label: 'Economic life', unit: 'yr', help: 'Years over which capital is recovered.' },
  'capital.installationFactors.shell': { label: 'Installation factor, shell', unit: '-', help: 'Bare-module or Lang-type factor: installed = purchased × factor.' },
  'capital.installationFactors.platforms': { label: 'Installation factor, platforms and ladders', unit: '-', help: 'Installed = purchased × factor.' },
  'capital.installationFactors.trays': { label: 'Installation factor, trays', unit: '-', help: 'Installed = purchased × factor.' },
  'capital.installationFactors.pump': { label: 'Installation factor, pump', unit: '-', help: 'Installed = purchased × factor.' },
  'capital.installationFactors.motor': { label: 'Installation factor, motor', unit: '-', help: 'Installed = purchased × factor.' },
  'capital.installationFactors.blower': { label: 'Installation factor, blower', unit: '-', help: 'Installed = purchased × factor.' },
  'capital.contingencyFactor': { label: 'Contingency and fee factor', unit: '-', help: 'Multiplies the installed total (1 = none).' },
  drives: { label: 'Pump and blower', unit: '', help: '' },
  'drives.pumpEfficiency': { label: 'Pump efficiency', unit: '-', help: 'Hydraulic efficiency of the solvent pump.' },
  'drives.motorEfficiency': { label: 'Pump motor efficiency', unit: '-', help: 'Electric motor efficiency.' },
  'drives.blowerEfficiency': { label: 'Blower efficiency', unit: '-', help: 'Fan or blower efficiency.' },
  'drives.blowerMotorEfficiency': { label: 'Blower motor efficiency', unit: '-', help: 'Electric motor efficiency of the blower drive.' },
  'drives.pumpHeadAllowance': { label: 'Pump head allowance', unit: 'm', help: 'Head added to the column height and the column gauge pressure (nozzles, distributor, control valve, piping).' },
  'drives.blowerPressureAllowance': { label: 'Blower pressure allowance', unit: 'Pa', help: 'Pressure rise added to the column pressure drop (ducts, demister, stack).' },
  materials: { label: 'Shell material', unit: '', help: '' },
  'materials.shellMassSource': { label: 'Shell mass from', unit: '-', help: "'design': the shell the design shows (recommended); 'costBasis': the same vessel model run with these material data." },
  'materials.shellDensity': { label: 'Shell material density', unit: 'kg/m3', help: 'Carbon steel about 7850.' },
  'materials.allowableStress': { label: 'Allowable stress', unit: 'Pa', help: 'Maximum allowable stress of the shell material at design temperature.' },
  'materials.jointEfficiency': { label: 'Joint efficiency', unit: '-', help: 'Weld joint efficiency, e.g. 0.85 or 1.0.' },
  'materials.corrosionAllowance': { label: 'Corrosion allowance', unit: 'm', help: 'Added to the pressure thickness.' },
  'materials.minimumDesignPressure': { label: 'Minimum design pressure', unit: 'Pa (gauge)', help: 'Lowest gauge pressure used for the shell thickness.' },
  'materials.minimumThickness': { label: 'Minimum wall by diameter', unit: 'm', help: 'Rows of (largest inside diameter, minimum thickness) for rigidity.' },
  correlations: { label: 'Capital-cost correlations', unit: '', help: '' },
  'correlations.shell': { label: 'Shell', unit: '', help: 'Purchased cost of the shell with two heads, by weight or volume.' },
  'correlations.shell.sizeBasis': { label: 'Shell size basis', unit: '-', help: "'mass' (shell + heads) or 'volume' (tangent-to-tangent)." },
  ...curveMeta('correlations.shell.curve', 'Shell'),
  'correlations.shell.materialFactor': { label: 'Shell material factor', unit: '-', help: 'F_M relative to carbon steel.' },
  'correlations.shell.headsAllowance': { label: 'Heads length allowance', unit: 'D (diameters)', help: 'Not used: the vessel model takes two 2:1 elliptical heads (kept for stored bases).' },
  'correlations.platforms': { label: 'Platforms and ladders', unit: '', help: 'C = a·D^p·L^q, D and L in the correlation length unit.' },
  'correlations.platforms.multiplier': { label: 'Platforms: multiplier a', unit: 'currency', help: '0 when the installation factors already cover them.' },
  'correlations.platforms.diameterExponent': { label: 'Platforms: diameter exponent p', unit: '-', help: '' },
  'correlations.platforms.heightExponent': { label: 'Platforms: height exponent q', unit: '-', help: '' },
  'correlations.platforms.lengthUnit': { label: 'Platforms: length unit', unit: '-', help: '' },
  'correlations.platforms.lengthFactor': { label: 'Platforms: length conversion', unit: 'unit per m', help: 'ft per m = 3.28084.' },
  'correlations.platforms.diameterMin': { label: 'Platforms: validity, minimum diameter', unit: 'length unit', help: '' },
  'correlations.platforms.diameterMax': { label: 'Platforms: validity, maximum diameter', unit: 'length unit', help: '' },
  'correlations.platforms.heightMin': { label: 'Platforms: validity, minimum height', unit: 'length unit', help: '' },
  'correlations.platforms.heightMax': { label: 'Platforms: validity, maximum height', unit: 'length unit', help: '' },
  'correlations.platforms.baseIndex': { label: 'Platforms: cost index of the correlation', unit: '-', help: '' },
  'correlations.platforms.baseYear': { label: 'Platforms: base year', unit: '-', help: '' },
  'correlations.platforms.source': { label: 'Platforms: source', unit: '-', help: '' },
  'correlations.trays': { label: 'Trays', unit: '', help: 'Per tray: base cost by diameter or area × type × material × count factors.' },
  'correlations.trays.sizeBasis': { label: 'Tray size basis', unit: '-', help: "'diameter' or 'area' (tower cross-section)." },
  ...curveMeta('correlations.trays.curve', 'Tray'),
  'correlations.trays.typeFactor': { label: 'Tray type factor', unit: '-', help: 'Sieve 1.0.' },
  'correlations.trays.materialFactorConstant': { label: 'Tray material factor, constant', unit: '-', help: 'F_TM = constant + slope × D.' },
  'correlations.trays.materialFactorSlope': { label: 'Tray material factor, slope', unit: '1/length unit', help: 'Per unit of the tray curve size unit (diameter basis only).' },
  'correlations.trays.countFactorForm': { label: 'Tray count factor form', unit: '-', help: "'geometric': c0 / c1^N; 'logPolynomial10': 10^(c0 + c1 log N + c2 (log N)^2); 'none'." },
  'correlations.trays.countFactorCoefficients': { label: 'Tray count factor coefficients', unit: '-', help: '' },
  'correlations.trays.countFactorBelow': { label: 'Count factor applies below', unit: 'trays', help: 'Factor is 1 at and above this tray count.' },
  'correlations.pump': { label: 'Solvent pump', unit: '', help: '' },
  'correlations.pump.sizeBasis': { label: 'Pump size basis', unit: '-', help: "'flowHead': S = Q·H^0.5 (Q gpm, H ft); 'shaftPower': S = shaft power." },
  ...curveMeta('correlations.pump.curve', 'Pump'),
  'correlations.pump.typeFactor': { label: 'Pump type factor', unit: '-', help: '' },
  'correlations.pump.materialFactor': { label: 'Pump material factor', unit: '-', help: '' },
  'correlations.motor': { label: 'Pump motor', unit: '', help: '' },
  'correlations.motor.included': { label: 'Cost the motor separately', unit: '-', help: 'Off when the pump correlation already includes its drive.' },
  ...curveMeta('correlations.motor.curve', 'Motor'),
  'correlations.motor.typeFactor': { label: 'Motor type factor', unit: '-', help: 'Enclosure type.' },
  'correlations.blower': { label: 'Blower', unit: '', help: 'Blower for the gas pressure drop.' },
  'correlations.blower.sizeBasis': { label: 'Blower size basis', unit: '-', help: "'power' (consumed power) or 'volumetricFlow'." },
  ...curveMeta('correlations.blower.curve', 'Blower'),
  'correlations.blower.materialFactor': { label: 'Blower material factor', unit: '-', help: '' },
  'correlations.blower.includesDrive': { label: 'Blower cost includes drive', unit: '-', help: 'Information only.' },
  sources: { label: 'Sources', unit: '-', help: 'Published sources and notes for this basis.' },
}

/** The groups in display order, with the field paths each holds. */
export const costBasisGroups: { key: string; label: string; prefix: string }[] = [
  { key: 'general', label: 'General', prefix: 'general' },
  { key: 'utilities', label: 'Utilities and values', prefix: 'utilities' },
  { key: 'capital', label: 'Capital and annualisation', prefix: 'capital' },
  { key: 'drives', label: 'Pump and blower', prefix: 'drives' },
  { key: 'materials', label: 'Shell material', prefix: 'materials' },
  { key: 'correlations.shell', label: 'Shell', prefix: 'correlations.shell' },
  { key: 'correlations.platforms', label: 'Platforms and ladders', prefix: 'correlations.platforms' },
  { key: 'correlations.trays', label: 'Trays', prefix: 'correlations.trays' },
  { key: 'correlations.pump', label: 'Solvent pump', prefix: 'correlations.pump' },
  { key: 'correlations.motor', label: 'Pump motor', prefix: 'correlations.motor' },
  { key: 'correlations.blower', label: 'Blower', prefix: 'correlations.blower' },
]

/**
 * The physical kind of the cost-basis fields that carry a unit, so screens and reports show them
 * in the person's unit system (stored values stay SI: m, Pa, kg/m³; prices per kWh, m³, kg).
 * Quantity kinds and price kinds are those of shared/units.ts.
 */
export const costBasisFieldKinds: Record<string, { quantity?: QuantityKind; price?: PriceKind }> = {
  'utilities.electricityPrice': { price: 'pricePerEnergy' },
  'utilities.solventCost': { price: 'pricePerVolume' },
  'utilities.productValue': { price: 'pricePerMass' },
  'utilities.emissionCharge': { price: 'pricePerMass' },
  'drives.pumpHeadAllowance': { quantity: 'length' },
  'drives.blowerPressureAllowance': { quantity: 'pressureDrop' },
  'materials.shellDensity': { quantity: 'density' },
  'materials.allowableStress': { quantity: 'stress' },
  'materials.corrosionAllowance': { quantity: 'smallLength' },
  'materials.minimumDesignPressure': { quantity: 'pressureGauge' },
  'materials.minimumThickness.maxDiameter': { quantity: 'length' },
  'materials.minimumThickness.thickness': { quantity: 'smallLength' },
}
