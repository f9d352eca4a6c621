/**
 * Typeset a unit for people: m^3/h -> m³/h, degC -> °C, kg/m^3 -> kg/m³, gpm ft^0.5 -> gpm·ft^0.5.
 * No imports (first screen).
 */
export function prettyUnit(unit: string): string {
  return unit
    .replace(/degC/g, '°C')
    .replace(/degF/g, '°F')
    .replace(/\^2\b/g, '²')
    .replace(/\^3\b/g, '³')
    .replace(/lbm\b/g, 'lb')
    .replace(/(\S) (?=[A-Za-z°])/g, '$1·')
}
