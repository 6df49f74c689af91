import { describe, expect, it } from 'vitest'
import { GENERATOR_VERSION, generateCase } from '~~/server/lib/engine/generator'
import { getCaseTemplate } from '~~/server/lib/engine/templates'
import { caseWithin, narrowedCase, narrowingProblems, torsionMeasures } from '~~/server/lib/quiz/narrow'

describe('narrowed case templates', () => {
  it('keeps the engine at generator version 1: narrowing never changes what the engine makes', () => {
    // Pinned: a quiz case is stored as (engine template id, seed, version) and must
    // regenerate identically; a new version needs a new replay path (docs/engine.md).
    expect(GENERATOR_VERSION).toBe(1)
    const found = narrowedCase('so-palsy-right-standard', { torsion: [6, 7] }, 'q-pin')
    expect(found.case).toEqual(generateCase('so-palsy-right-standard', found.seed))
  })

  it('draws only cases inside the narrower range, deterministically', () => {
    const t = getCaseTemplate('so-palsy-right-standard')!
    const seeds = ['a', 'b', 'c', 'd', 'e', 'f', 'g', 'h']
    for (const s of seeds) {
      const { case: c, seed } = narrowedCase(t.id, { torsion: [6, 7], vertical: [5, 8] }, s)
      expect(torsionMeasures(c, t.ranges.torsionOf)[0]).toBeGreaterThanOrEqual(6)
      expect(torsionMeasures(c, t.ranges.torsionOf)[0]).toBeLessThanOrEqual(7)
      expect(Math.abs(c.gazes.primary.vertical)).toBeLessThanOrEqual(8)
      expect(caseWithin(c, t, { torsion: [6, 7], vertical: [5, 8] })).toBe(true)
      expect(narrowedCase(t.id, { torsion: [6, 7], vertical: [5, 8] }, s).seed).toBe(seed)
    }
  })

  it('measures torsion the way each template states its range', () => {
    const bilateral = generateCase('bilateral-so-palsy-standard', 'x1')
    const p = bilateral.gazes.primary.torsion
    expect(torsionMeasures(bilateral, 'total')).toEqual([p.RE + p.LE])
    const left = generateCase('so-palsy-left-standard', 'x1')
    // the affected eye of a left palsy is the left eye
    expect(torsionMeasures(left, 'affected-eye')).toEqual([Math.abs(left.gazes.primary.torsion.LE)])
  })

  it('refuses ranges outside the published ones and ranges too narrow to draw from', () => {
    expect(narrowingProblems('so-palsy-right-standard', { torsion: [3, 8] })).toEqual([
      { path: 'ranges.torsion', message: expect.stringContaining('4–8°') },
    ])
    expect(narrowingProblems('so-palsy-right-standard', { vertical: [5, 13] })[0]!.path).toBe('ranges.vertical')
    // findings are stored to 0.1°, so no patient falls strictly between 7.9 and 8.0
    const tooNarrow = narrowingProblems('so-palsy-right-standard', { torsion: [7.91, 7.99] })
    expect(tooNarrow[0]!.message).toMatch(/Too narrow/)
    expect(narrowingProblems('so-palsy-right-standard', { torsion: [5, 7] })).toEqual([])
    expect(narrowingProblems('no-such-template', {})[0]!.path).toBe('templateId')
  })
})
