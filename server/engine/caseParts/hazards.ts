/** The cautions a hazardous solute or carrier gas adds to every result (common practice wording). */

export const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1)
export const HAZARD_CAUTIONS: Record<string, (name: string, role: string) => string> = {
  flammable: (n) =>
    `${n} is flammable: the vent gas and the vapour space can be within flammable limits; classify the area, control ignition sources and ventilate.`,
  toxic: (n) => `${n} is toxic: check exposure limits, leak detection and the fate of the unabsorbed ${n} in the vent.`,
  corrosive: (n) => `${n} is corrosive: check materials of construction.`,
  asphyxiant: (n) =>
    `${n} is an asphyxiant: the vent must discharge where it cannot accumulate; confined-space entry rules apply to the column.`,
}
