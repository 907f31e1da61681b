import { uValueSchema, uValue } from '../../../shared/calc'

/** Public U-value check by the combined method of EN ISO 6946, rate-limited per client address. */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  rateLimit(event, { bucket: 'calc:u-value' })
  const input = await readValidatedBody(event, parseWith(uValueSchema))
  return runCalc(() => uValue(input))
})
