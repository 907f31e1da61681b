/**
 * How much a request body may carry, in one place for the body-limit middleware and the tests. JSON forms are
 * small (the longest text field is 20,000 characters, under 130 kB even fully escaped), so 1 MiB leaves room
 * and still stops a caller from making the server buffer hundreds of megabytes before validation runs.
 */
export const jsonBodyMaxBytes = 1024 * 1024

/**
 * Routes that stream their own multipart body to disk with per-file and per-enquiry limits (server/utils/uploads.ts
 * and uploadLimits); every other route reads its body into memory and is held to jsonBodyMaxBytes.
 */
const streamedUploadRoutes = [/^\/api\/enquiries$/, /^\/api\/enquiries\/[^/]+\/messages$/]

/** The mail provider's hook reads a raw message and checks its own, larger limit (inbound-mail). */
const ownLimitRoutes = [/^\/api\/mail\/inbound$/]

/** The most a body to this route may hold, or null where the route enforces a limit of its own. */
export function bodyLimitFor(path: string, contentType: string): number | null {
  const route = path.split('?')[0]!.replace(/\/+$/, '')
  if (ownLimitRoutes.some(r => r.test(route))) return null
  if (contentType.toLowerCase().startsWith('multipart/form-data') && streamedUploadRoutes.some(r => r.test(route))) return null
  return jsonBodyMaxBytes
}
