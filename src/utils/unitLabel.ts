/** Typeset a units-library unit for people (the one rule lives in shared/unitText.ts). */
export { prettyUnit } from '@shared/unitText.ts'
