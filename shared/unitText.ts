/** Typeset a unit for people: m^3/h -> m³/h, degC -> °C, kg/m^3 -> kg/m³. No imports (first screen). */
export function prettyUnit(unit: string): string {
  return unit
    .replace(/degC/g, '°C')
    .replace(/degF/g, '°F')
    .replace(/\^2/g, '²')
    .replace(/\^3/g, '³')
    .replace(/lbm\b/g, 'lb')
    .replace(/ s\b/g, '·s')
}
