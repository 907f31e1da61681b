/**
 * Raised when a calculation input is outside what the method can handle.
 * The message is written for the person who typed the value, and `field` names the input.
 */
export class CalcInputError extends Error {
  readonly field: string

  constructor(field: string, message: string) {
    super(message)
    this.name = 'CalcInputError'
    this.field = field
  }
}

/** Throws unless `value` is a finite number. */
export function requireFinite(field: string, value: unknown): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new CalcInputError(field, `${field} must be a number`)
  }
  return value
}

/** Throws unless `value` is a finite number greater than zero. */
export function requirePositive(field: string, value: unknown): number {
  const n = requireFinite(field, value)
  if (n <= 0) throw new CalcInputError(field, `${field} must be greater than zero (got ${n})`)
  return n
}

/** Throws unless `value` is a finite number in [min, max]. */
export function requireRange(field: string, value: unknown, min: number, max: number): number {
  const n = requireFinite(field, value)
  if (n < min || n > max) throw new CalcInputError(field, `${field} must be between ${min} and ${max} (got ${n})`)
  return n
}
