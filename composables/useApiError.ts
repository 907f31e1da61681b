/** The message a person should read from a failed $fetch: the server's own sentence, else a plain fallback. */
export function apiErrorMessage(error: unknown, fallback = 'Something went wrong. Please try again.'): string {
  const e = error as { data?: { message?: string, statusMessage?: string }, statusMessage?: string, message?: string }
  return e?.data?.message || e?.data?.statusMessage || e?.statusMessage || fallback
}
