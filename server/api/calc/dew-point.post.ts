import { dewPointSchema } from '../../../shared/calc'

/** Public dew point of air at a temperature and humidity, rate-limited per client address. */
export default defineEventHandler(async (event) => {
  await publicRoute(event)
  rateLimit(event, { bucket: 'calc:dew-point' })
  const input = await readValidatedBody(event, parseWith(dewPointSchema))
  return runCalc(() => dewPointResult(input))
})
