import type { CaseSI } from '../../engine/case.ts'
import type { CheckResult, DesignResult } from '../../../shared/schemas/results.ts'
import type { CostBreakdown } from '../../engine/costing/index.ts'
import { isUnitOf, convert } from '../../../shared/units.ts'
import type { CheckRow, CostRow, Row, RowGroup } from './model.ts'
import { DisplayUnits, plain, prettyUnit } from './units.ts'

/**
 * The report's rows, labelled as the screens label them and in the reader's unit system:
 * the inputs the engine used, the design summary, the vendor data sheet, the tray checks
 * and the cost items.
 */

const EQUILIBRIUM_NAMES: Record<CaseSI['equilibrium']['model'], string> = {
  constantK: 'Constant K',
  henry: "Henry's law",
  modifiedRaoult: 'Modified Raoult',
  table: 'x-y table',
}

const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1)

/** Whether the study's own inputs hold a value at this path (otherwise the engine took a default or the library's). */
function given(inputs: unknown, path: string): boolean {
  let v: unknown = inputs
  for (const k of path.split('.')) {
    if (v === null || typeof v !== 'object') return false
    v = (v as Record<string, unknown>)[k]
  }
  return v !== undefined && v !== null && v !== ''
}

/** The inputs the design used (the study's values, the defaults and the library's values), grouped as on the form. */
export function inputGroups(c: CaseSI, inputs: unknown, u: DisplayUnits): RowGroup[] {
  const src = (path: string, r: Row): Row => (given(inputs, path) ? r : { ...r, label: `${r.label} (default or library)` })
  const eq = c.equilibrium
  const eqRows: Row[] = [plain('equilibrium.model', 'Equilibrium model', EQUILIBRIUM_NAMES[eq.model])]
  if (eq.model === 'constantK') eqRows.push(plain('equilibrium.K', 'K = y / x', eq.K, '', 4))
  if (eq.model === 'henry') {
    eqRows.push(src('equilibrium.Hcp', u.row('equilibrium.Hcp', 'Solubility constant at 298.15 K', 'henrySolubility', eq.Hcp)))
    eqRows.push(src('equilibrium.B', u.row('equilibrium.B', 'Temperature slope d ln H / d(1/T)', 'inverseTemperatureSlope', eq.B)))
  }
  if (eq.model === 'modifiedRaoult') {
    eqRows.push(src('equilibrium.gammaInf', plain('equilibrium.gammaInf', 'Activity coefficient at infinite dilution γ∞', eq.gammaInf)))
    if (eq.vapourPressure !== null) eqRows.push(u.row('equilibrium.vapourPressure', 'Vapour pressure of the solute', 'pressure', eq.vapourPressure))
  }
  if (eq.model === 'table') eqRows.push(plain('equilibrium.points', 'x-y points (table)', eq.x.length, 'points'))
  const t = c.tray
  return [
    {
      title: 'Gas',
      rows: [
        u.row('gas.flow', 'Gas flow into the column', 'molarFlow', c.gas.flow),
        u.row('gas.temperature', 'Gas temperature', 'temperature', c.gas.temperature),
        u.row('gas.pressure', 'Column pressure (absolute)', 'pressure', c.gas.pressure),
        plain('gas.soluteMoleFraction', 'Solute in the gas', c.gas.soluteMoleFraction * 100, 'mol %'),
        plain('gas.carrier', 'Carrier gas', cap(c.gas.carrierName ?? 'custom')),
        src('gas.carrierMolarMass', u.row('gas.carrierMolarMass', 'Carrier molar mass', 'molarMass', c.gas.carrierMolarMass)),
      ],
    },
    {
      title: 'Solute and solvent',
      rows: [
        plain('solute', 'Solute', cap(c.solute.name ?? 'custom')),
        src('solute.molarMass', u.row('solute.molarMass', 'Solute molar mass', 'molarMass', c.solute.molarMass)),
        plain('solvent', 'Solvent', cap(c.solvent.name ?? 'custom')),
        src('solvent.temperature', u.row('solvent.temperature', 'Lean solvent temperature', 'temperature', c.solvent.temperature)),
        src('solvent.soluteMoleFraction', plain('solvent.soluteMoleFraction', 'Solute in the lean solvent', c.solvent.soluteMoleFraction * 100, 'mol %')),
        src('solvent.density', u.row('solvent.density', 'Solvent density', 'density', c.solvent.density)),
        src('solvent.viscosity', u.row('solvent.viscosity', 'Solvent viscosity', 'viscosity', c.solvent.viscosity)),
        src('solvent.surfaceTension', u.row('solvent.surfaceTension', 'Solvent surface tension', 'surfaceTension', c.solvent.surfaceTension)),
      ],
    },
    { title: 'Equilibrium', rows: eqRows },
    {
      title: 'Targets and efficiency',
      rows: [
        plain('recovery', 'Recovery of the solute', c.recovery * 100, '%'),
        plain('solventFactor', 'Solvent factor L / Lmin', c.solventFactor, '×'),
        plain('efficiency.model', 'Tray efficiency', c.efficiency.model === 'oconnell' ? "O'Connell correlation" : 'Fixed value'),
        ...(c.efficiency.model === 'fixed' ? [plain('efficiency.value', 'Overall tray efficiency', c.efficiency.value * 100, '%')] : []),
      ],
    },
    {
      title: 'Sieve trays',
      rows: [
        src('tray.holeDiameter', u.row('tray.holeDiameter', 'Hole diameter', 'smallLength', t.holeDiameter)),
        src('tray.holePitch', u.row('tray.holePitch', 'Hole pitch', 'smallLength', t.holePitch)),
        src('tray.thickness', u.row('tray.thickness', 'Tray deck thickness', 'smallLength', t.thickness)),
        src('tray.weirHeight', u.row('tray.weirHeight', 'Outlet weir height', 'smallLength', t.weirHeight)),
        src('tray.downcomerClearance', u.row('tray.downcomerClearance', 'Downcomer clearance', 'smallLength', t.downcomerClearance)),
        src('tray.floodFraction', plain('tray.floodFraction', 'Design approach to flood', t.floodFraction * 100, '%')),
        src('tray.foamingFactor', plain('tray.foamingFactor', 'Foaming (system) factor', t.foamingFactor, '')),
        t.spacing === 'auto' ? plain('tray.spacing', 'Tray spacing', 'from diameter') : u.row('tray.spacing', 'Tray spacing', 'length', t.spacing),
      ],
    },
    {
      title: 'Column and shell',
      rows: [
        plain('method', 'Stage calculation', c.method === 'auto' ? 'Automatic' : c.method === 'kremser' ? 'Kremser' : 'Stage by stage'),
        src('column.temperature', u.row('column.temperature', 'Column temperature', 'temperature', c.columnTemperature)),
        src('column.diameterStep', u.row('column.diameterStep', 'Diameter step (rounding up)', 'length', c.column.diameterStep)),
        src('column.topAllowance', u.row('column.topAllowance', 'Space above the top tray', 'length', c.column.topAllowance)),
        src('column.bottomAllowance', u.row('column.bottomAllowance', 'Space below the bottom tray', 'length', c.column.bottomAllowance)),
        src('vessel.allowableStress', u.row('vessel.allowableStress', 'Allowable stress of the shell', 'stress', c.vessel.allowableStress)),
        src('vessel.jointEfficiency', plain('vessel.jointEfficiency', 'Weld joint efficiency', c.vessel.jointEfficiency, '')),
        src('vessel.corrosionAllowance', u.row('vessel.corrosionAllowance', 'Corrosion allowance', 'smallLength', c.vessel.corrosionAllowance)),
        src('vessel.materialDensity', u.row('vessel.materialDensity', 'Shell material density', 'density', c.vessel.materialDensity)),
      ],
    },
  ]
}

const KMOLH = 3.6 // mol/s per kmol/h
const flow = (u: DisplayUnits, key: string, label: string, kmolh: number) => u.row(key, label, 'molarFlow', kmolh / KMOLH)
const massFlow = (u: DisplayUnits, key: string, label: string, kgh: number) => u.row(key, label, 'massFlow', kgh / 3600)

/** The design summary in the groups of the Column screen. */
export function summaryGroups(d: DesignResult, u: DisplayUnits): RowGroup[] {
  const s = d.summary
  const p = d.profile
  return [
    {
      title: 'Staging and flows',
      rows: [
        plain('theoreticalStages', 'Theoretical stages', s.theoreticalStages, '', 3),
        plain('actualTrays', 'Actual trays', s.actualTrays, ''),
        plain('overallEfficiency', 'Overall tray efficiency', (s.overallEfficiency ?? s.theoreticalStages / Math.max(1, s.actualTrays)) * 100, '%', 3),
        plain('absorptionFactor', 'Absorption factor', s.absorptionFactor, '', 3),
        plain('method', 'Method', p.method === 'kremser' ? 'Kremser (dilute)' : 'Stage by stage'),
        plain('recovery', 'Recovery (target)', s.recovery * 100, '%'),
        ...(s.achievedRecovery !== undefined ? [plain('achievedRecovery', 'Recovery reached with the trays', s.achievedRecovery * 100, '%')] : []),
        flow(u, 'minimumSolventFlow', 'Minimum solvent flow', s.minimumSolventFlow),
        flow(u, 'solventFlow', 'Solvent flow', s.solventFlow),
        plain('solventFactor', 'Solvent factor L / Lmin', s.solventFactor, '×', 3),
        u.row('solventVolumetricFlow', 'Solvent flow (volume)', 'liquidVolumetricFlow', s.solventVolumetricFlow / 3600),
        massFlow(u, 'solventMassFlow', 'Solvent flow (mass)', s.solventMassFlow),
        flow(u, 'gasFlow', 'Gas flow (inlet)', s.gasFlow),
        u.row('gasVolumetricFlow', 'Gas flow (volume, inlet)', 'gasVolumetricFlow', s.gasVolumetricFlow),
        plain('outletGasSoluteMoleFraction', 'Solute in cleaned gas', s.outletGasSoluteMoleFraction * 1e6, 'ppm (mol)', 3),
        plain('richSolventSoluteMoleFraction', 'Solute in rich solvent', s.richSolventSoluteMoleFraction * 100, 'mol %', 3),
        massFlow(u, 'soluteInGas', 'Solute in the feed gas', s.soluteInGas),
        massFlow(u, 'soluteAbsorbed', 'Solute recovered', s.soluteAbsorbed),
        massFlow(u, 'soluteLost', 'Solute lost', s.soluteLost),
      ],
    },
    {
      title: 'Column size',
      rows: [
        u.row('diameter', 'Diameter, calculated', 'length', s.diameter, 3),
        u.row('selectedDiameter', 'Diameter, selected', 'length', s.selectedDiameter, 3),
        u.row('traySpacing', 'Tray spacing', 'length', s.traySpacing, 3),
        u.row('columnHeight', 'Column height (tangent to tangent)', 'length', s.columnHeight, 3),
        plain('floodFraction', 'Approach to flood, target (sizing basis)', 100 * (s.fractionOfFloodTarget ?? s.floodFraction), '%', 3),
        plain('percentFlood', 'Approach to flood, achieved at selected diameter', s.percentFlood, '%', 3),
        plain('flowParameter', 'Flow parameter', s.flowParameter, '', 3),
        u.row('capacityFactor', 'Capacity factor', 'velocity', s.capacityFactor, 3),
        u.row('floodingVelocity', 'Flooding velocity', 'velocity', s.floodingVelocity, 3),
        u.row('gasDensity', 'Gas density', 'density', s.gasDensity, 3),
        plain('downcomerAreaFraction', 'Downcomer area / column area', s.downcomerAreaFraction * 100, '%', 3),
        plain('holeAreaFraction', 'Hole area / active area', s.holeAreaFraction * 100, '%', 3),
        u.row('pressureDropPerTray', 'Pressure drop per tray', 'pressureDrop', s.pressureDropPerTray, 3),
        u.row('columnPressureDrop', 'Column pressure drop', 'pressureDrop', s.columnPressureDrop, 3),
        u.row('operatingPressure', 'Operating pressure (absolute)', 'pressure', s.operatingPressure, 4),
        u.row('designPressure', 'Design pressure (gauge, preliminary)', 'pressureGauge', s.designPressure, 4),
        u.row('shellThickness', 'Shell thickness (preliminary)', 'smallLength', s.shellThickness, 3),
        u.row('shellMass', 'Shell and heads mass (preliminary)', 'mass', s.shellMass, 3),
      ],
    },
  ]
}

interface Hydraulics {
  activeArea?: number
  holeArea?: number
  downcomerArea?: number
  towerArea?: number
  weirLength?: number
}

function hydraulicsOf(d: DesignResult): Hydraulics {
  const h = (d.detail as { hydraulics?: unknown }).hydraulics
  return h && typeof h === 'object' ? (h as Hydraulics) : {}
}

const num = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v)

/** The numbers a vendor enquiry needs, on one page: duty, streams, column, tray layout, materials. */
export function dataSheetGroups(c: CaseSI, d: DesignResult, u: DisplayUnits): RowGroup[] {
  const s = d.summary
  const h = hydraulicsOf(d)
  const solute = cap(c.solute.name ?? 'solute')
  const area = (key: string, label: string, v: unknown): Row[] => (num(v) ? [u.row(key, label, 'area', v, 3)] : [])
  return [
    {
      title: 'Duty',
      rows: [
        plain('service', 'Service', `${solute} absorbed from ${c.gas.carrierName ?? 'the gas'} into ${c.solvent.name ?? 'the solvent'}`),
        plain('recovery', 'Recovery of the solute', s.recovery * 100, '%'),
        massFlow(u, 'soluteAbsorbed', 'Solute recovered', s.soluteAbsorbed),
        plain('equilibrium', 'Equilibrium basis', EQUILIBRIUM_NAMES[c.equilibrium.model]),
      ],
    },
    {
      title: 'Gas',
      rows: [
        flow(u, 'gasIn', 'Flow in', s.gasFlow),
        u.row('gasVolume', 'Flow in (volume, at inlet)', 'gasVolumetricFlow', s.gasVolumetricFlow, 3),
        u.row('gasTemperature', 'Temperature in', 'temperature', c.gas.temperature, 3),
        u.row('pressure', 'Pressure (absolute)', 'pressure', s.operatingPressure, 4),
        plain('yIn', 'Solute in', c.gas.soluteMoleFraction * 100, 'mol %', 3),
        plain('yOut', 'Solute out', s.outletGasSoluteMoleFraction * 1e6, 'ppm (mol)', 3),
        u.row('gasDensity', 'Density', 'density', s.gasDensity, 3),
      ],
    },
    {
      title: 'Solvent',
      rows: [
        plain('solvent', 'Solvent', cap(c.solvent.name ?? 'custom')),
        flow(u, 'solventFlow', 'Flow', s.solventFlow),
        u.row('solventVolume', 'Flow (volume)', 'liquidVolumetricFlow', s.solventVolumetricFlow / 3600, 3),
        u.row('solventTemperature', 'Temperature in', 'temperature', c.solvent.temperature, 3),
        plain('xIn', 'Solute in (lean)', c.solvent.soluteMoleFraction * 100, 'mol %', 3),
        plain('xOut', 'Solute out (rich)', s.richSolventSoluteMoleFraction * 100, 'mol %', 3),
        u.row('solventDensity', 'Density', 'density', c.solvent.density, 4),
      ],
    },
    {
      title: 'Column',
      rows: [
        plain('actualTrays', 'Sieve trays', s.actualTrays, ''),
        plain('theoreticalStages', 'Theoretical stages', s.theoreticalStages, '', 3),
        plain('overallEfficiency', 'Overall tray efficiency', (s.overallEfficiency ?? s.theoreticalStages / Math.max(1, s.actualTrays)) * 100, '%', 3),
        u.row('selectedDiameter', 'Inside diameter', 'length', s.selectedDiameter, 3),
        u.row('traySpacing', 'Tray spacing', 'length', s.traySpacing, 3),
        u.row('columnHeight', 'Height, tangent to tangent', 'length', s.columnHeight, 3),
        plain('percentFlood', 'Percent of flood (worst end)', s.percentFlood, '%', 3),
        u.row('pressureDropPerTray', 'Pressure drop per tray', 'pressureDrop', s.pressureDropPerTray, 3),
        u.row('columnPressureDrop', 'Column pressure drop', 'pressureDrop', s.columnPressureDrop, 3),
        u.row('designPressure', 'Design pressure (gauge)', 'pressureGauge', s.designPressure, 4),
      ],
    },
    {
      title: 'Tray layout',
      rows: [
        u.row('holeDiameter', 'Hole diameter', 'smallLength', c.tray.holeDiameter, 3),
        u.row('holePitch', 'Hole pitch (triangular)', 'smallLength', c.tray.holePitch, 3),
        u.row('deck', 'Deck thickness', 'smallLength', c.tray.thickness, 3),
        plain('holeAreaFraction', 'Hole area / active area', s.holeAreaFraction * 100, '%', 3),
        u.row('weirHeight', 'Outlet weir height', 'smallLength', c.tray.weirHeight, 3),
        ...(num(h.weirLength) ? [u.row('weirLength', 'Weir length', 'length', h.weirLength, 3)] : []),
        u.row('downcomerClearance', 'Downcomer clearance', 'smallLength', c.tray.downcomerClearance, 3),
        plain('downcomerAreaFraction', 'Downcomer area / column area', s.downcomerAreaFraction * 100, '%', 3),
        ...area('activeArea', 'Active area', h.activeArea),
        ...area('holeArea', 'Hole area', h.holeArea),
      ],
    },
    {
      title: 'Materials (basis of the estimate)',
      rows: [
        u.row('shellThickness', 'Shell thickness (preliminary)', 'smallLength', s.shellThickness, 3),
        u.row('corrosionAllowance', 'Corrosion allowance (included)', 'smallLength', c.vessel.corrosionAllowance, 3),
        u.row('allowableStress', 'Allowable stress', 'stress', c.vessel.allowableStress, 3),
        plain('jointEfficiency', 'Weld joint efficiency', c.vessel.jointEfficiency, '', 3),
        u.row('shellMass', 'Shell and heads mass', 'mass', s.shellMass, 3),
        plain('materials', 'Materials of construction', 'to suit the service; confirm with the vendor'),
      ],
    },
  ]
}

/** Check units the units library knows, shown in the reader's system (the rest: %, -, s). */
const CHECK_KINDS = { Pa: 'pressureDrop', m: 'smallLength' } as const

export function checkRows(checks: CheckResult[], u: DisplayUnits): CheckRow[] {
  return checks.map((ch) => {
    const kind = CHECK_KINDS[ch.unit as keyof typeof CHECK_KINDS]
    const conv = (v: number) => (kind ? u.fromSI(kind, v) : v)
    return {
      key: ch.key, label: ch.label, value: conv(ch.value), limit: conv(ch.limit), direction: ch.direction ?? null,
      unit: kind ? u.unit(kind) : ch.unit === '-' ? '' : ch.unit, status: ch.status, advice: ch.advice ?? null,
    }
  })
}

const HP = 0.74569987158227022 // kW per mechanical horsepower (550 ft lbf/s), exact from the ft, lb and g_n definitions
const GAL = 3.785411784e-3 // m^3 per US gallon, exact
const LB = 0.45359237 // kg per lb, exact
/** Annual quantities and powers of the cost items: [SI unit, US unit, SI per US unit]. */
const PAIRED: [string, string, number][] = [
  ['kW', 'hp', HP],
  ['m3/yr', 'gal/yr', GAL],
  ['kg/yr', 'lb/yr', LB],
  ['kWh/yr', 'kWh/yr', 1],
]

/** Cost-item sizes in the reader's system where the unit converts; a correlation's own compound size unit stays as it is. */
function sizeIn(u: DisplayUnits, size: number, unit: string): { size: number; sizeUnit: string } {
  for (const kind of ['mass', 'length'] as const) {
    if (isUnitOf(kind, unit)) return { size: u.from(kind, size, unit), sizeUnit: u.unit(kind) }
  }
  if (unit === 'm^3/h' || unit === 'gpm') {
    const to = u.system === 'US' ? 'gpm' : 'm^3/h'
    return { size: convert(size, unit, to), sizeUnit: prettyUnit(to) }
  }
  for (const [si, us, factor] of PAIRED) {
    if (unit !== si && unit !== us) continue
    const inSI = unit === si ? size : size * factor
    return u.system === 'US' ? { size: inSI / factor, sizeUnit: prettyUnit(us) } : { size: inSI, sizeUnit: prettyUnit(si.replace('m3', 'm^3')) }
  }
  return { size, sizeUnit: `${unit.replace(/ /g, '·')} (correlation unit)` }
}

export function costRows(b: CostBreakdown, u: DisplayUnits): CostRow[] {
  const rows: CostRow[] = b.capital.map((c) => ({
    key: c.key, label: c.label, kind: 'capital' as const, ...sizeIn(u, c.size, c.sizeUnit), purchased: c.purchased, installed: c.installed, annual: c.annual,
  }))
  for (const o of b.operating) rows.push({ key: o.key, label: o.label, kind: 'operating', ...sizeIn(u, o.quantity, o.quantityUnit), purchased: null, installed: null, annual: o.annual })
  return rows
}
