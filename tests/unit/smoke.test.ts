import { describe, expect, it } from 'vitest'
import seedrandom from 'seedrandom'

describe('toolchain', () => {
  it('seedrandom gives the same sequence for the same seed', () => {
    const a = seedrandom('cyclodial')
    const b = seedrandom('cyclodial')
    expect([a(), a()]).toEqual([b(), b()])
  })
})
