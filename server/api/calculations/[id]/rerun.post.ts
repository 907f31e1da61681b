import { z } from 'zod'
import { ENGINE_VERSION } from '../../../../shared/calc'
import { Calculation, Enquiry } from '../../../models'

const paramsSchema = z.object({ id: z.coerce.number({ error: 'Not a calculation number' }).int().positive('Not a calculation number') })

/**
 * Runs a saved calculation's inputs on the current engine and lists every output that now differs. Stores
 * nothing: the saved record stays as it was answered.
 */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const { id } = await getValidatedRouterParams(event, parseWith(paramsSchema))
  useDb()
  const calc = await Calculation.findByPk(id, { include: [{ model: Enquiry, as: 'enquiry', attributes: ['ref'], where: enquiryScope(caller) }] })
  if (!calc) notFound('calculation')
  const saved = JSON.parse(calc.outputs) as unknown
  const name = calc.method as CalcMethod
  if (!(name in calcMethods)) {
    throw createError({ statusCode: 422, statusMessage: 'Method withdrawn', message: `The method "${calc.method}" is no longer in the engine, so this calculation cannot be re-run.` })
  }

  // Inputs the current engine or schema now refuses are a difference to show, not a failure of the re-run.
  let current: unknown = null
  let error: string | null = null
  try {
    current = runSavedMethod(name, JSON.parse(calc.inputs)).outputs
  }
  catch (e) {
    const status = (e as { statusCode?: number }).statusCode
    if (status !== 400 && status !== 422) throw e
    error = (e as { message?: string }).message ?? 'The current engine refuses these inputs'
  }
  const differences = error === null ? diffOutputs(saved, current) : []
  return {
    calculationId: calc.id,
    enquiryRef: (calc as Calculation & { enquiry?: Enquiry }).enquiry?.ref ?? null,
    method: calc.method,
    savedEngineVersion: calc.engineVersion,
    currentEngineVersion: ENGINE_VERSION,
    saved,
    current,
    error,
    identical: error === null && differences.length === 0,
    differences,
  }
})
