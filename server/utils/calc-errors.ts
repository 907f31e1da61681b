import { CalcInputError } from '../../shared/calc/errors'

/** True for the engine's own input errors (also across bundles, where `instanceof` may not hold). */
export function isCalcInputError(error: unknown): error is CalcInputError {
  return error instanceof CalcInputError || (error instanceof Error && error.name === 'CalcInputError' && 'field' in error)
}

/**
 * Runs an engine call and turns its CalcInputError into a 422: the input had the right shape (zod passed) but
 * the method cannot work with it, e.g. a target U that no thickness reaches. The message is the engine's own,
 * written for the person who typed the value; `data.field` names the input. Anything else is a real fault.
 */
export function runCalc<T>(calculate: () => T): T {
  try {
    return calculate()
  }
  catch (error) {
    if (isCalcInputError(error)) {
      throw createError({
        statusCode: 422,
        statusMessage: 'Cannot calculate with these inputs',
        message: error.message,
        data: { field: error.field },
      })
    }
    throw error
  }
}
