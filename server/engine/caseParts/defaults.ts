/** Defaults applied when a case leaves a value out; each says where it comes from. */

export const CASE_DEFAULTS = {
  tray: {
    holeDiameter: 0.0045, // m, common practice 3-6 mm (4.5 mm typical)
    holePitch: 0.012, // m, 2.5-3 d_o
    thickness: 0.002, // m
    spacing: 'auto' as const,
    floodFraction: 0.8, // common practice (Benitez/Treybal examples)
    foamingFactor: 1.0, // non-foaming
    weirHeight: 0.05, // m, Sinnott: 40-50 mm above atmospheric pressure
    downcomerClearanceBelowWeir: 0.01, // m: apron clearance = weir height - 10 mm (common practice)
    turndownFraction: 0.5, // sieve trays turn down to about 50 % of design gas before weeping (common practice)
  },
  column: {
    diameterStep: 0.05, // m, common practice
    topAllowance: 1.0, // m above the top tray (Benitez Illus. 6.7)
    bottomAllowance: 3.0, // m below the bottom tray (Benitez Illus. 6.7)
  },
  vessel: {
    designPressureMarginFactor: 1.1, // design = max(1.1 x operating gauge, operating gauge + 170 kPa): common practice
    designPressureMarginAdd: 170e3, // Pa
    allowableStress: 138e6, // Pa, carbon steel SA-516-70 near ambient (from memory)
    jointEfficiency: 0.85, // spot radiography
    corrosionAllowance: 0.003, // m
    materialDensity: 7850, // kg/m3 carbon steel
  },
}
