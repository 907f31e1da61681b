import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { formatCount } from '../../shared/format/count'

// The queue writes its counts without Intl; they must read exactly as Intl's en-IE number format writes them
// (the reference here is the runtime's own ICU data, not a recalled value).
describe('formatCount', () => {
  const intl = new Intl.NumberFormat('en-IE', { maximumFractionDigits: 0, roundingMode: 'trunc' } as Intl.NumberFormatOptions)

  it('groups thousands as en-IE does', () => {
    expect(formatCount(0)).toBe('0')
    expect(formatCount(999)).toBe('999')
    expect(formatCount(1000)).toBe('1,000')
    expect(formatCount(100_006)).toBe('100,006')
    expect(formatCount(4_001_234)).toBe('4,001,234')
  })

  it('agrees with Intl for any whole number', () => {
    fc.assert(fc.property(fc.integer({ min: -1e12, max: 1e12 }), n => formatCount(n) === intl.format(n)), { numRuns: 2000 })
  })

  it('drops a fraction rather than rounding it', () => {
    expect(formatCount(1999.9)).toBe('1,999')
  })
})
