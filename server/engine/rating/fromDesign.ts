/**
 * The rating case of a designed (approved, built) column: the design case without its
 * targets, the as-built column from the design summary, and the design solvent flow.
 */
import type { DesignSummary } from '../../../shared/schemas/results.ts'

/** Build the raw rating case (case-file conventions) from a design case and its summary. */
export function ratingCaseOfDesign(inputs: Record<string, unknown>, s: DesignSummary, weirLength?: number): Record<string, unknown> {
  const { recovery: _r, solventFactor: _f, costBasis: _c, search: _s, ...rest } = inputs
  const col = (inputs.column && typeof inputs.column === 'object' ? inputs.column : {}) as Record<string, unknown>
  const tray = (inputs.tray && typeof inputs.tray === 'object' ? { ...(inputs.tray as Record<string, unknown>) } : undefined)
  // the installed spacing is the column's; the design's spacing setting (or 'auto') does not apply
  if (tray) delete tray.spacing
  return {
    ...rest,
    ...(tray ? { tray } : {}),
    column: {
      ...col,
      diameter: s.selectedDiameter,
      actualTrays: s.actualTrays,
      traySpacing: s.traySpacing,
      downcomerAreaFraction: s.downcomerAreaFraction,
      ...(weirLength !== undefined ? { weirLength } : {}),
    },
    solventFlow: s.solventFlow,
  }
}
