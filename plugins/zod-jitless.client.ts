import { z } from 'zod'

// The pages' Content-Security-Policy has no 'unsafe-eval' (server/plugins/security-headers.ts). Zod compiles
// object parsers with `new Function` when it may, and finds out by trying as each object schema is built,
// which the browser reports as a policy violation; its interpreted parser is plenty fast for our forms.
// Set when this file is imported, with the other plugins in the entry: before any page chunk builds a schema.
z.config({ jitless: true })

export default defineNuxtPlugin({ name: 'zod-jitless', enforce: 'pre', setup() {} })
