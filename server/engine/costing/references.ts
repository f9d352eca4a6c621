/**
 * Bibliography of the cost model and the optimiser, by key. Correlation doc blocks cite these keys.
 */
export interface Reference {
  key: string
  authors: string
  title: string
  edition?: string
  publisher?: string
  year: number
  isbn?: string
  where?: string
  note?: string
}

export const costingReferences = {
  press2007: {
    key: 'press2007',
    authors: 'W. H. Press, S. A. Teukolsky, W. T. Vetterling, B. P. Flannery',
    title: 'Numerical Recipes: The Art of Scientific Computing',
    edition: '3rd',
    publisher: 'Cambridge University Press',
    year: 2007,
    isbn: '978-0-521-88068-8',
    where: 'Sec. 15.4, general linear least squares (normal equations)',
    note: 'From memory.',
  },
  seider2009: {
    key: 'seider2009',
    authors: 'W. D. Seider, J. D. Seader, D. R. Lewin, S. Widagdo',
    title: 'Product and Process Design Principles: Synthesis, Analysis and Evaluation',
    edition: '3rd',
    publisher: 'Wiley',
    year: 2009,
    isbn: '978-0-470-04895-5',
    where: 'Ch. 22, cost of pressure vessels and towers, pumps and motors, fans and blowers; CE = 500',
    note: 'Coefficients entered from memory; confirm against the edition in use (the 4th edition rebases to CE = 567).',
  },
  turton2009: {
    key: 'turton2009',
    authors: 'R. Turton, R. C. Bailie, W. B. Whiting, J. A. Shaeiwitz',
    title: 'Analysis, Synthesis, and Design of Chemical Processes',
    edition: '3rd',
    publisher: 'Prentice Hall',
    year: 2009,
    isbn: '978-0-13-512966-1',
    where: 'Ch. 7 (eq. 7.10, Example 7.13) and Appendix A; CEPCI = 397 (September 2001)',
  },
  asmeVIII1: {
    key: 'asmeVIII1',
    authors: 'ASME',
    title: 'Boiler and Pressure Vessel Code, Section VIII, Division 1, UG-27 (thickness of shells under internal pressure)',
    year: 2023,
  },
  cepci: {
    key: 'cepci',
    authors: 'Chemical Engineering magazine',
    title: 'Chemical Engineering Plant Cost Index (CEPCI), annual averages, 1957-59 = 100',
    year: 2024,
    note: '2001 394.3; 2006 499.6; 2010 550.8; 2019 607.5; 2023 797.9 (annual averages).',
  },
  crf: {
    key: 'crf',
    authors: 'standard engineering economics',
    title: 'Capital recovery factor (uniform series from a present value), A/P = i(1+i)^n/((1+i)^n - 1)',
    year: 1950,
    note: 'Found in every engineering-economics text and compound-interest table (A/P column).',
  },
  hookeJeeves1961: {
    key: 'hookeJeeves1961',
    authors: 'R. Hooke, T. A. Jeeves',
    title: '"Direct search" solution of numerical and statistical problems',
    publisher: 'Journal of the ACM 8(2), 212-229',
    year: 1961,
    note: 'doi:10.1145/321062.321069; the pattern search the optimiser refines with.',
  },
} as const satisfies Record<string, Reference>

/** A key of the cost model's bibliography; a citation to a missing key does not compile. */
export type CostingReferenceKey = keyof typeof costingReferences
