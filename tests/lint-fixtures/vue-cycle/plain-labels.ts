// Lint fixture (never built): a leaf module.
export const plainLabel = 'Plain'
