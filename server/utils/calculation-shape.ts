import type { Calculation, User } from '../models'

/** A saved calculation as it leaves the server, its JSON columns parsed. */
export function publicCalculation(calc: Calculation, enquiryRef: string) {
  const author = (calc as Calculation & { author?: User }).author
  return {
    id: calc.id,
    enquiryRef,
    method: calc.method,
    inputs: JSON.parse(calc.inputs) as unknown,
    outputs: JSON.parse(calc.outputs) as unknown,
    engineVersion: calc.engineVersion,
    createdBy: author ? { id: author.id, name: author.name } : { id: calc.createdBy, name: null },
    createdAt: calc.createdAt,
  }
}
