import { defineStore } from 'pinia'
import type { EnquiryTopic, Priority, projectStages } from '~~/shared/types/enquiry'

/** Form fields as typed: strings while being edited, parsed by the shared schema when a step is left. */
function emptyDraft() {
  return {
    requester: { name: '', organisation: '', email: '', phone: '' },
    project: {
      name: '',
      siteAddress: '',
      region: '',
      stage: '' as typeof projectStages[number] | '',
      buildingType: '',
      storeys: '',
      wallAreaM2: '',
    },
    topic: '' as EnquiryTopic | '',
    subject: '',
    question: '',
    priority: 'normal' as Priority,
  }
}
export type EnquiryDraftFields = ReturnType<typeof emptyDraft>

export const intakeSteps = ['requester', 'project', 'question', 'drawings', 'review'] as const
export type IntakeStep = typeof intakeSteps[number]

/**
 * The multi-step enquiry form, kept in session storage so a reload (or a detour to sign in) keeps what was
 * typed. Files are not kept: a browser cannot store a chosen file for later, so the drawings step says so.
 */
export const useEnquiryDraftStore = defineStore('enquiry-draft', () => {
  const fields = ref(emptyDraft())
  const step = ref<IntakeStep>('requester')

  function reset() {
    fields.value = emptyDraft()
    step.value = 'requester'
  }

  return { fields, step, reset }
}, {
  persist: { storage: piniaPluginPersistedstate.sessionStorage() },
})
