/**
 * CSV as RFC 4180 writes it: comma-separated, CRLF line ends, a field quoted when it holds a comma, a quote
 * or a line break, quotes inside doubled. A text field that begins with =, +, - or @ is prefixed with an
 * apostrophe so a spreadsheet shows it instead of running it as a formula (OWASP, "CSV injection").
 */
export type CsvValue = string | number | null | undefined

export function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return ''
  let text = typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : value
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

export function toCsv(header: readonly string[], rows: readonly (readonly CsvValue[])[]): string {
  return [header, ...rows].map(r => r.map(csvField).join(',')).join('\r\n') + '\r\n'
}
