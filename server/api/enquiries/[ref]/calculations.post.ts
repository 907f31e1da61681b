import { z } from 'zod'
import { ENGINE_VERSION } from '../../../../shared/calc'
import { enquiryRefSchema } from '../../../../shared/schemas/enquiry'
import { Calculation, Enquiry, User } from '../../../models'

// Outputs are deliberately not part of the body: the server runs the engine and stores its own answer.
const saveCalculationSchema = z.object({
  method: calcMethodSchema,
  inputs: z.unknown().refine(v => v !== undefined, { error: 'Give the inputs of the calculation' }),
})

/** Saves a calculation to an enquiry: the server re-runs it and stores inputs, outputs, engine version and author. */
export default defineEventHandler(async (event) => {
  const caller = await requireStaff(event)
  const { ref } = await getValidatedRouterParams(event, parseWith(enquiryRefSchema))
  const body = await readValidatedBody(event, parseWith(saveCalculationSchema))
  useDb()
  const enquiry = await Enquiry.findOne({ where: { ref, ...enquiryScope(caller) } })
  if (!enquiry) notFound('enquiry')

  const { inputs, outputs } = runSavedMethod(body.method, body.inputs)
  const calc = await Calculation.create({
    enquiryId: enquiry.id,
    method: body.method,
    inputs: JSON.stringify(inputs),
    outputs: JSON.stringify(outputs),
    engineVersion: ENGINE_VERSION,
    createdBy: caller.id,
  })
  await recordAudit(event, {
    actorUserId: caller.id,
    action: 'calculation.saved',
    subjectType: 'enquiry',
    subjectId: enquiry.id,
    detail: { calculationId: calc.id, method: body.method, engineVersion: ENGINE_VERSION },
  })
  const saved = await Calculation.findByPk(calc.id, { include: [{ model: User, as: 'author', attributes: ['id', 'name'] }] })
  setResponseStatus(event, 201)
  return { calculation: publicCalculation(saved ?? calc, enquiry.ref) }
})
