/**
 * Bibliography of the design engine, by key. Every correlation's doc block names its
 * source by one of these keys. `tag` says how far a value is vouched for:
 * 'C' read in the named source, 'D' derived from a C formula, 'M' from memory (to be
 * confirmed before it becomes a hard test value), 'CP' common practice.
 */
export interface Reference {
  key: string
  authors: string
  title: string
  year: number
  publisher?: string
  isbn?: string
  doi?: string
  page?: string
  note?: string
  tag: 'C' | 'D' | 'M' | 'CP'
}

export const REFERENCES = {
  codata2018: {
    key: 'codata2018',
    authors: 'Tiesinga, E.; Mohr, P. J.; Newell, D. B.; Taylor, B. N.',
    title: 'CODATA recommended values of the fundamental physical constants: 2018',
    year: 2021,
    doi: '10.1103/RevModPhys.93.025010',
    note: 'R = N_A k = 8.314 462 618 15 J/(mol K), exact since the 2019 SI revision',
    tag: 'C',
  },
  iapwsR176: {
    key: 'iapwsR176',
    authors: 'International Association for the Properties of Water and Steam',
    title: 'IAPWS R1-76(2014): Revised Release on Surface Tension of Ordinary Water Substance',
    year: 2014,
    note: 'sigma = 235.8 tau^1.256 (1 - 0.625 tau) mN/m, tau = 1 - T/647.096 K',
    tag: 'C',
  },
  kell1975: {
    key: 'kell1975',
    authors: 'Kell, G. S.',
    title: 'Density, thermal expansivity, and compressibility of liquid water from 0 to 150 C',
    year: 1975,
    doi: '10.1021/je60064a005',
    page: 'J. Chem. Eng. Data 20(1), 97-105, eq. 16',
    note: 'constants from memory; checked against IAPWS-95 values at 20, 25, 30 C in the tests',
    tag: 'M',
  },
  iapws2008viscosity: {
    key: 'iapws2008viscosity',
    authors: 'Huber, M. L. et al.',
    title: 'New international formulation for the viscosity of H2O',
    year: 2009,
    doi: '10.1063/1.3088050',
    note: 'IAPWS R12-08, Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary Water Substance; the same formulation as the paper (Tables 1 and 2 coefficients)',
    tag: 'C',
  },
  sander2015: {
    key: 'sander2015',
    authors: 'Sander, R.',
    title: "Compilation of Henry's law constants (version 4.0) for water as solvent",
    year: 2015,
    doi: '10.5194/acp-15-4399-2015',
    page: 'Atmos. Chem. Phys. 15, 4399-4981',
    tag: 'C',
  },
  sander2023: {
    key: 'sander2023',
    authors: 'Sander, R.',
    title: "Compilation of Henry's law constants (version 5.0.0) for water as solvent",
    year: 2023,
    doi: '10.5194/acp-23-10901-2023',
    page: 'Atmos. Chem. Phys. 23, 10901-12440',
    tag: 'C',
  },
  kremser1930: {
    key: 'kremser1930',
    authors: 'Kremser, A.',
    title: 'Theoretical analysis of absorption process',
    year: 1930,
    page: 'Natl. Petroleum News 22(21), 43',
    note: 'used in the form of Benitez 2009, eq. 5.x (Illustration 5.1)',
    tag: 'C',
  },
  benitez2009: {
    key: 'benitez2009',
    authors: 'Benitez, J.',
    title: 'Principles and Modern Applications of Mass Transfer Operations, 2nd ed.',
    year: 2009,
    publisher: 'Wiley',
    isbn: '978-0-470-18178-2',
    page: 'ch. 4 (eqs 4.29-4.47, sieve-tray hydraulics), ch. 5 (Kremser), Illus. 6.7',
    tag: 'C',
  },
  treybal1980: {
    key: 'treybal1980',
    authors: 'Treybal, R. E.',
    title: 'Mass-Transfer Operations, 3rd ed.',
    year: 1980,
    publisher: 'McGraw-Hill',
    isbn: '0-07-065176-0',
    page: 'ch. 6, Table 6.1 (tray spacing), Table 6.2 (flooding constants), eq. 6.31, Illus. 6.3',
    tag: 'C',
  },
  fair1961: {
    key: 'fair1961',
    authors: 'Fair, J. R.',
    title: 'How to predict sieve tray entrainment and flooding',
    year: 1961,
    page: 'Petro/Chem Engineer 33(10), 45',
    note: 'used through the curve fit of Treybal Table 6.2 / Benitez eqs 4.29-4.32',
    tag: 'C',
  },
  bennett1983: {
    key: 'bennett1983',
    authors: 'Bennett, D. L.; Agrawal, R.; Cook, P. J.',
    title: 'New pressure drop correlation for sieve tray distillation columns',
    year: 1983,
    doi: '10.1002/aic.690290307',
    page: 'AIChE J. 29(3), 434-442 (as given in Benitez 2009, ch. 4)',
    tag: 'C',
  },
  oconnell1946: {
    key: 'oconnell1946',
    authors: "O'Connell, H. E.",
    title: 'Plate efficiency of fractionating columns and absorbers',
    year: 1946,
    page: 'Trans. AIChE 42, 741-755',
    note: 'absorber form as the Edmister-type fit given by Seader & Henley (from memory)',
    tag: 'M',
  },
  seaderHenley2011: {
    key: 'seaderHenley2011',
    authors: 'Seader, J. D.; Henley, E. J.; Roper, D. K.',
    title: 'Separation Process Principles, 3rd ed.',
    year: 2011,
    publisher: 'Wiley',
    isbn: '978-0-470-48183-7',
    page: 'ch. 6 (absorber efficiency fit)',
    tag: 'M',
  },
  sinnott2005: {
    key: 'sinnott2005',
    authors: 'Sinnott, R. K.',
    title: "Coulson & Richardson's Chemical Engineering Vol. 6: Chemical Engineering Design, 4th ed.",
    year: 2005,
    publisher: 'Elsevier Butterworth-Heinemann',
    isbn: '0-7506-6538-6',
    page: 'sec. 11.13 (Francis weir crest, downcomer backup and residence time), sec. 13.5 (minimum wall thickness)',
    tag: 'C',
  },
  asmeVIII1: {
    key: 'asmeVIII1',
    authors: 'ASME',
    title: 'Boiler and Pressure Vessel Code, Section VIII Division 1, UG-27 (thickness of shells under internal pressure)',
    year: 2023,
    note: 't = P R/(S E - 0.6 P); valid for t <= R/2 and P <= 0.385 S E',
    tag: 'C',
  },
  kister1992: {
    key: 'kister1992',
    authors: 'Kister, H. Z.',
    title: 'Distillation Design',
    year: 1992,
    publisher: 'McGraw-Hill',
    isbn: '0-07-034909-6',
    note: 'foaming (system) factors, e.g. about 0.9 for alcohol absorbers (from memory)',
    tag: 'M',
  },
  antoineYaws: {
    key: 'antoineYaws',
    authors: 'Dean, J. A. (ed.)',
    title: "Lange's Handbook of Chemistry, 15th ed., Table 5.8 (Antoine constants)",
    year: 1999,
    publisher: 'McGraw-Hill',
    isbn: '0-07-016384-7',
    note: 'constants used from memory; log10(P/mmHg) = A - B/(C + t/degC)',
    tag: 'M',
  },
  perry2008: {
    key: 'perry2008',
    authors: 'Green, D. W.; Perry, R. H. (eds.)',
    title: "Perry's Chemical Engineers' Handbook, 8th ed.",
    year: 2008,
    publisher: 'McGraw-Hill',
    isbn: '978-0-07-142294-9',
    note: 'gas viscosities, molar masses, hazard classes (values used from memory)',
    tag: 'M',
  },
  fritschCarlson1980: {
    key: 'fritschCarlson1980',
    authors: 'Fritsch, F. N.; Carlson, R. E.',
    title: 'Monotone piecewise cubic interpolation',
    year: 1980,
    doi: '10.1137/0717021',
    page: 'SIAM J. Numer. Anal. 17(2), 238-246',
    tag: 'C',
  },
  liebson1957: {
    key: 'liebson1957',
    authors: 'Liebson, I.; Kelley, R. E.; Bullington, L. A.',
    title: 'How to design perforated trays',
    year: 1957,
    page: 'Petroleum Refiner 36(2), 127-133: the orifice-coefficient chart (C_o against A_h/A_a and plate thickness / hole diameter)',
    note: 'used through the fit given by benitez2009 ch. 4; citation details from memory',
    tag: 'M',
  },
  colburn1936: {
    key: 'colburn1936',
    authors: 'Colburn, A. P.',
    title: 'Effect of entrainment on plate efficiency in distillation',
    year: 1936,
    doi: '10.1021/ie50317a008',
    page: 'Ind. Eng. Chem. 28(5), 526-530: E_a = E/(1 + E psi/(1 - psi))',
    note: 'as quoted by ludwig1997; citation details from memory',
    tag: 'M',
  },
  ludwig1997: {
    key: 'ludwig1997',
    authors: 'Ludwig, E. E.',
    title: 'Applied Process Design for Chemical and Petrochemical Plants, Vol. 2',
    year: 1997,
    publisher: 'Gulf Professional Publishing, 3rd ed.',
    isbn: '978-0-88415-101-9',
    page: 'ch. 8 (distillation trays): entrainment correction of the efficiency p. 200; hole-area factor table',
    note: 'from memory',
    tag: 'M',
  },
  iupac2021: {
    key: 'iupac2021',
    authors: 'Prohaska, T. et al.',
    title: 'Standard atomic weights of the elements 2021 (IUPAC Technical Report)',
    year: 2022,
    doi: '10.1515/pac-2019-0603',
    page: 'Pure Appl. Chem. 94(5), 573-600: H 1.008, O 15.999 -> H2O 18.015 g/mol',
    note: 'citation details from memory',
    tag: 'M',
  },
  commonPractice: {
    key: 'commonPractice',
    authors: 'Scrubwright engineering team',
    title: 'Common practice of the trade (rules of thumb used as editable defaults)',
    year: 2026,
    tag: 'CP',
  },
  mckay1979: {
    key: 'mckay1979',
    authors: 'McKay, M. D.; Beckman, R. J.; Conover, W. J.',
    title: 'A comparison of three methods for selecting values of input variables in the analysis of output from a computer code',
    year: 1979,
    doi: '10.1080/00401706.1979.10489755',
    page: 'Technometrics 21(2), 239-245',
    note: 'Latin hypercube sampling (details from memory)',
    tag: 'M',
  },
  owen1997: {
    key: 'owen1997',
    authors: 'Owen, A. B.',
    title: 'Monte Carlo variance of scrambled net quadrature / Latin hypercube sampling variance bound',
    year: 1997,
    note: 'the variance of a Latin hypercube mean is at most n/(n-1) times that of simple random sampling (from memory)',
    tag: 'M',
  },
  blackman2021: {
    key: 'blackman2021',
    authors: 'Blackman, D.; Vigna, S.',
    title: 'Scrambled linear pseudorandom number generators',
    year: 2021,
    doi: '10.1145/3460772',
    page: 'ACM Trans. Math. Softw. 47(4), 36',
    note: 'xoshiro128** (constants from memory; reproducibility is what the product relies on)',
    tag: 'M',
  },
  press2007: {
    key: 'press2007',
    authors: 'Press, W. H.; Teukolsky, S. A.; Vetterling, W. T.; Flannery, B. P.',
    title: 'Numerical Recipes, 3rd ed.',
    year: 2007,
    publisher: 'Cambridge University Press',
    isbn: '978-0-521-88068-8',
    page: 'section 6.2 (erfc, Chebyshev fit)',
    note: 'coefficients from memory; checked against an independent erf in the tests',
    tag: 'M',
  },
  acklam2003: {
    key: 'acklam2003',
    authors: 'Acklam, P. J.',
    title: 'An algorithm for computing the inverse normal cumulative distribution function',
    year: 2003,
    note: 'rational approximation, relative error 1.15e-9 (coefficients from memory; checked against an independent erf in the tests)',
    tag: 'M',
  },
  spearman1904: {
    key: 'spearman1904',
    authors: 'Spearman, C.',
    title: 'The proof and measurement of association between two things',
    year: 1904,
    doi: '10.2307/1412159',
    page: 'Am. J. Psychol. 15(1), 72-101',
    tag: 'M',
  },
  wilson1927: {
    key: 'wilson1927',
    authors: 'Wilson, E. B.',
    title: 'Probable inference, the law of succession, and statistical inference',
    year: 1927,
    doi: '10.1080/01621459.1927.10502953',
    page: 'J. Am. Stat. Assoc. 22(158), 209-212',
    note: 'score interval for a binomial proportion',
    tag: 'M',
  },
} as const satisfies Record<string, Reference>

export type ReferenceKey = keyof typeof REFERENCES

/**
 * A source text whose reference keys the compiler checks: cite`Fair (${'fair1961'}); limit: ${'commonPractice'}`
 * gives 'Fair (fair1961); limit: commonPractice', and a key missing from REFERENCES does not compile.
 */
export function cite(strings: TemplateStringsArray, ...keys: ReferenceKey[]): string {
  let out = strings[0] ?? ''
  for (let i = 0; i < keys.length; i++) out += keys[i]! + (strings[i + 1] ?? '')
  return out
}
