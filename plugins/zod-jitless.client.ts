// The pages' Content-Security-Policy has no 'unsafe-eval' (server/plugins/security-headers.ts). Zod compiles
// object parsers with `new Function` when it may, and decides as each object schema is built; the browser
// reports the attempt as a policy violation. Its interpreted parser is plenty fast for our forms.
// Zod reads its settings from this global object (zod/v4/core/core.js), so the setting is made here, as the
// entry is evaluated and before any page chunk builds a schema, without pulling zod itself into the entry:
// the pages without forms never download it.
declare global {
  var __zod_globalConfig: { jitless?: boolean } | undefined
}
globalThis.__zod_globalConfig ??= {}
globalThis.__zod_globalConfig.jitless = true

export default defineNuxtPlugin({ name: 'zod-jitless', enforce: 'pre', setup() {} })
