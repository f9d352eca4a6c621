/** Fitting of cost curves to the site's own vendor quotes. */
export * from './costCurveFit.ts'
