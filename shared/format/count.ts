/**
 * A whole number with its thousands separated by commas, as en-IE writes them ("100,006"), without Intl: on a
 * page that shows no time, a count is often the only thing that would start the browser's ICU library, which
 * holds a phone's main thread for 100 ms or more the first time (composables/useDeskFormat.ts).
 */
export function formatCount(n: number): string {
  const digits = String(Math.trunc(Math.abs(n)))
  return `${n < 0 ? '-' : ''}${digits.replace(/\B(?=(\d{3})+(?!\d))/g, ',')}`
}
