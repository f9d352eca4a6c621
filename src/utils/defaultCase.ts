import type { CaseInput } from '@/api/types.ts'

/** A starting case for a new study: fermenter off-gas (CO2 with ethanol) washed with water. */
export function defaultCase(): CaseInput {
  return {
    gas: { flow: 180, temperature: 30, pressure: 110, soluteMoleFraction: 0.012, carrier: 'carbon dioxide' },
    solute: 'ethanol',
    solvent: 'water',
    equilibrium: { model: 'constantK', K: 0.43 },
    recovery: 0.97,
    solventFactor: 1.5,
    tray: {
      holeDiameter: 5,
      holePitch: 15,
      thickness: 2,
      spacing: 'auto',
      floodFraction: 0.75,
      foamingFactor: 1,
      weirHeight: 50,
    },
    efficiency: { model: 'oconnell' },
  }
}
