import { sequelize } from '../../db/sequelize.ts'
import { CostBasis, VendorQuote } from '../../db/models/index.ts'
import { AppError, ConflictError, NotFoundError, ValidationError, zodDetails } from '../../errors.ts'
import { audit } from '../audit.ts'
import { basisInForce, getVersion } from '../cost-bases.ts'
import { costFromCurve, loadPreset, DEFAULT_PRESET } from '../../engine/costing/index.ts'
import { fitCostCurve, FitError, logSpacedSizes, costFromFit, type FitForm } from '../../engine/fitting/index.ts'
import { costBasisSchema, type CostBasisData, type CostCurveData } from '../../../shared/schemas/costBasis.ts'
import type { FitResult, FittableType } from '../../../shared/schemas/uploads.ts'
import type { AuthUser } from '../../types.d.ts'

/** Cost-curve fits to a site's vendor quotes, and adopting a fit into a draft cost basis. */

async function comparisonBasis(siteId: number, costBasisId?: number): Promise<{ data: CostBasisData; id: number | null; version: number | null; preset: string | null }> {
  if (costBasisId !== undefined) {
    const b = await CostBasis.findOne({ where: { id: costBasisId, siteId } })
    if (!b) throw new ValidationError('Unknown cost basis.', [{ path: 'body.costBasisId', message: 'is not a version of this site' }])
    return { data: b.data as CostBasisData, id: b.id, version: b.version, preset: null }
  }
  const b = await basisInForce(siteId)
  if (b) return { data: b.data as CostBasisData, id: b.id, version: b.version, preset: null }
  return { data: loadPreset(DEFAULT_PRESET), id: null, version: null, preset: DEFAULT_PRESET }
}

function fitFailed(message: string, code: string, path = 'body.equipmentType'): AppError {
  return new AppError(422, 'fit_not_possible', message, [{ path, message, code }])
}

/** Default form: the form of the basis curve (three or more log terms and no linear term -> quadraticLog). */
function defaultForm(curve: CostCurveData): FitForm {
  return curve.coefficients.length >= 3 && curve.linearCoefficient === 0 ? 'quadraticLog' : 'power'
}

export async function fitQuotes(siteId: number, body: { equipmentType: FittableType; targetIndex?: number; form?: FitForm; costBasisId?: number }): Promise<FitResult> {
  const basis = await comparisonBasis(siteId, body.costBasisId)
  const curve = basis.data.correlations[body.equipmentType].curve
  const targetIndex = body.targetIndex ?? basis.data.general.targetIndex
  const currency = basis.data.general.currency
  const form = body.form ?? defaultForm(curve)
  const rows = await VendorQuote.findAll({ where: { siteId, equipmentType: body.equipmentType }, order: [['size', 'ASC'], ['id', 'ASC']] })
  const warnings: string[] = []
  const otherUnit = rows.filter((q) => q.sizeUnit !== curve.sizeUnit)
  const otherCurrency = rows.filter((q) => q.sizeUnit === curve.sizeUnit && q.currency !== currency)
  if (otherUnit.length) warnings.push(`${otherUnit.length} quote(s) are left out: their size unit differs from the curve's '${curve.sizeUnit}'.`)
  if (otherCurrency.length) warnings.push(`${otherCurrency.length} quote(s) are left out: their currency differs from ${currency}.`)
  const used = rows.filter((q) => q.sizeUnit === curve.sizeUnit && q.currency === currency)
  const noIndex = used.filter((q) => q.costIndex === null).length
  if (noIndex) warnings.push(`${noIndex} quote(s) carry no cost index and are taken as at index ${targetIndex}.`)
  const points = used.map((q) => ({ size: q.size, cost: q.costIndex ? (q.cost * targetIndex) / q.costIndex : q.cost }))

  let fit
  try {
    fit = fitCostCurve(points, form, curve.logBase)
  } catch (e) {
    if (e instanceof FitError) throw fitFailed(`${e.message}${rows.length !== used.length ? ` (${rows.length - used.length} of ${rows.length} quotes were left out for unit or currency)` : ''}`, e.code)
    throw e
  }
  if (fit.dof === 0) warnings.push('There are as many quotes as coefficients: the curve passes through every quote and R² says nothing about the fit.')

  // The basis curve at the same sizes, escalated to the same index (purchased cost, before material or type factors).
  const basisCost = (S: number) => (costFromCurve(S / curve.sizeFactor, curve) * targetIndex) / curve.baseIndex
  const source = `Fit to ${fit.n} vendor quote${fit.n === 1 ? '' : 's'} of the site (${form}, R² = ${fit.r2.toFixed(4)})`
  const baseYear = targetIndex === basis.data.general.targetIndex ? basis.data.general.targetYear : `index ${targetIndex}`
  const adopt = {
    equipmentType: body.equipmentType,
    logBase: curve.logBase,
    coefficients: fit.coefficients,
    sizeMin: fit.sizeMin,
    sizeMax: fit.sizeMax,
    baseIndex: targetIndex,
    baseYear,
    source,
  }
  return {
    equipmentType: body.equipmentType,
    form,
    currency,
    targetIndex,
    sizeUnit: curve.sizeUnit,
    logBase: fit.logBase,
    coefficients: fit.coefficients,
    r2: fit.r2,
    rmsLogResidual: fit.rmsLogResidual,
    n: fit.n,
    dof: fit.dof,
    curve: adoptedCurve(curve, adopt),
    adopt,
    points: used.map((q, i) => {
      const r = fit.residuals[i]!
      return {
        quoteId: q.id, size: q.size, cost: q.cost, costIndex: q.costIndex, escalatedCost: r.cost,
        fitted: r.fitted, logResidual: r.logResidual, relativeError: r.relativeError, basisCost: basisCost(q.size),
      }
    }),
    line: logSpacedSizes(fit.sizeMin, fit.sizeMax, 41).map((S) => ({ size: S, fitted: costFromFit(S, fit.coefficients, fit.logBase), basis: basisCost(S) })),
    basis: { costBasisId: basis.id, version: basis.version, preset: basis.preset, curve },
    warnings,
  }
}

function adoptedCurve(old: CostCurveData, a: { logBase: 'e' | '10'; coefficients: number[]; sizeMin: number; sizeMax: number; baseIndex: number; baseYear: string; source: string }): CostCurveData {
  return {
    ...old,
    logBase: a.logBase,
    multiplier: 1,
    coefficients: [...a.coefficients],
    linearCoefficient: 0,
    sizeMin: a.sizeMin,
    sizeMax: a.sizeMax,
    baseIndex: a.baseIndex,
    baseYear: a.baseYear,
    source: a.source,
  }
}

export interface AdoptFitInput {
  equipmentType: FittableType
  coefficients: number[]
  logBase?: 'e' | '10'
  sizeMin?: number
  sizeMax?: number
  baseIndex?: number
  baseYear?: string
  source?: string
  lockVersion: number
}

/** Write fitted coefficients into a draft cost basis (409 when published or stale). */
export async function adoptFit(siteId: number, id: number, body: AdoptFitInput, actor: AuthUser, requestId: string) {
  await sequelize.transaction(async (transaction) => {
    const b = await CostBasis.findOne({ where: { id, siteId }, transaction, lock: transaction.LOCK.UPDATE })
    if (!b) throw new NotFoundError('Cost basis')
    if (b.status !== 'draft') throw new ConflictError(`Version ${b.version} is published and cannot change; create a new draft to adopt the fit.`)
    if (b.lockVersion !== body.lockVersion) {
      throw new ConflictError('Someone else changed this draft since you opened it; reload to see their changes.', [
        { path: 'body.lockVersion', message: `is ${body.lockVersion}, current is ${b.lockVersion}` },
      ])
    }
    const data = structuredClone(b.data) as CostBasisData
    const corr = data.correlations[body.equipmentType]
    const before = corr.curve
    corr.curve = adoptedCurve(before, {
      coefficients: body.coefficients,
      logBase: body.logBase ?? before.logBase,
      sizeMin: body.sizeMin ?? before.sizeMin,
      sizeMax: body.sizeMax ?? before.sizeMax,
      baseIndex: body.baseIndex ?? data.general.targetIndex,
      baseYear: body.baseYear ?? (body.baseIndex === undefined ? data.general.targetYear : `index ${body.baseIndex}`),
      source: body.source ?? 'Fit to vendor quotes of the site',
    })
    const checked = costBasisSchema.safeParse(data)
    if (!checked.success) throw new ValidationError('The fitted curve does not fit the cost basis.', zodDetails(checked.error, 'body'))
    b.data = checked.data
    b.lockVersion = b.lockVersion + 1
    await b.save({ transaction })
    await audit({ userId: actor.id, siteId, action: 'adopt_fit', entity: 'cost_basis', entityId: b.id, before: { equipmentType: body.equipmentType, curve: before }, after: { equipmentType: body.equipmentType, curve: corr.curve }, requestId }, transaction)
  })
  return getVersion(siteId, id)
}
