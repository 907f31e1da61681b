import type { ZodType } from 'zod'
import { CalcInputError } from '~/shared/calc'

export interface CalcFieldError {
  /** The input it concerns, in the engine's notation: `layers[2].thickness_mm`. */
  field: string
  message: string
}

export type CalcState<I, R>
  = | { input: I, result: R, error: null }
    | { input: I | null, result: null, error: CalcFieldError }

type Issue = { path: PropertyKey[], message: string, code?: string, errors?: Issue[][] }

function fieldName(path: PropertyKey[]): string {
  return path.reduce<string>((name, part) => (typeof part === 'number' ? `${name}[${part}]` : name ? `${name}.${String(part)}` : String(part)), '')
}

/**
 * The most telling issue of a failed parse. A union that matches no branch reports only "Invalid input", so
 * descend into the branch with the fewest complaints (the one the person most likely meant).
 */
export function readableIssue(issue: Issue, prefix: PropertyKey[] = []): CalcFieldError {
  const path = [...prefix, ...issue.path]
  if (issue.code === 'invalid_union' && issue.errors?.length) {
    const branch = issue.errors.reduce((best, b) => (b.length && (!best.length || b.length < best.length) ? b : best), [] as Issue[])
    if (branch[0]) return readableIssue(branch[0], path)
  }
  return { field: fieldName(path), message: issue.message }
}

function isCalcInputError(e: unknown): e is CalcInputError {
  return e instanceof CalcInputError || (e instanceof Error && e.name === 'CalcInputError' && 'field' in e)
}

/**
 * A live calculation: rebuilds the input whenever what `build` reads changes, checks it with the same zod schema
 * as the API route, runs the engine in the browser and turns an input error into a field message (never NaN).
 */
export function useCalc<I, R>(schema: ZodType<I>, build: () => I, run: (input: I) => R) {
  return computed<CalcState<I, R>>(() => {
    let input: I
    try {
      input = build()
    }
    catch (e) {
      if (isCalcInputError(e)) return { input: null, result: null, error: { field: e.field, message: e.message } }
      throw e
    }
    const parsed = schema.safeParse(input)
    if (!parsed.success) return { input, result: null, error: readableIssue(parsed.error.issues[0] as Issue) }
    try {
      return { input: parsed.data, result: run(parsed.data), error: null }
    }
    catch (e) {
      if (isCalcInputError(e)) return { input: parsed.data, result: null, error: { field: e.field, message: e.message } }
      throw e
    }
  })
}

/** An optional number field: empty stays absent, so the schema names it rather than the engine seeing NaN. */
export function num(value: number | null | undefined): number {
  return (typeof value === 'number' && Number.isFinite(value) ? value : undefined) as number
}
