import { describe, expect, it } from 'vitest'
import { diffOutputs } from '../../server/utils/calc-methods'

// common practice: a re-run compares saved and current outputs leaf by leaf, so each case is derived by hand.
describe('diffOutputs', () => {
  it.each([
    ['identical results', { u: 0.15, paths: [{ r: 1 }] }, { u: 0.15, paths: [{ r: 1 }] }, []],
    ['a changed number', { u: 0.15 }, { u: 0.16 }, [{ path: 'u', saved: 0.15, current: 0.16 }]],
    ['a changed array entry', { months: [{ a: 1 }, { a: 2 }] }, { months: [{ a: 1 }, { a: 3 }] }, [{ path: 'months.1.a', saved: 2, current: 3 }]],
    ['a field the current engine added', { u: 1 }, { u: 1, deltaUchi: 0 }, [{ path: 'deltaUchi', saved: null, current: 0 }]],
    ['a field the current engine dropped', { u: 1, old: 'x' }, { u: 1 }, [{ path: 'old', saved: 'x', current: null }]],
    ['an array that became longer', { planes: [1] }, { planes: [1, 2] }, [{ path: 'planes.1', saved: null, current: 2 }]],
    ['a whole value of another type', 1, 'one', [{ path: '(whole result)', saved: 1, current: 'one' }]],
  ])('lists %s', (_case, saved, current, expected) => {
    expect(diffOutputs(saved, current)).toEqual(expected)
  })
})
