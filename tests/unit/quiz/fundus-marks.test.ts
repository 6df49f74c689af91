// A fundus item's marks from the fundus grading: each criterion is the mean of
// its per-eye marks, weighted by the item; photograph items read their snapshot.
import { describe, expect, it } from 'vitest'
import { fundusItemPictures, gradeFundusItem } from '~~/server/lib/quiz/fundus-item'
import type { FundusItemConfig } from '~~/server/lib/quiz/items'
import { resolveWeights } from '~~/server/lib/quiz/items'
import { applyOverrides, fundusMarksOf, pointsOf } from '~~/server/lib/quiz/marks'

const photoConfig: FundusItemConfig = {
  kind: 'fundus',
  // RE photograph: fovea 200 px temporal of and 25 px below the disc centre → atan(25/200) = 7.1° (arithmetic)
  source: { type: 'photo', id: 7, title: 'T', eye: 'RE', width: 640, height: 480, disc: { x: 430, y: 220 }, fovea: { x: 230, y: 245 }, angle: 7.1 },
  perStudent: false,
  tolerance: 1,
  weights: { fundusAngle: 3, fundusFinding: 1 } as FundusItemConfig['weights'],
}

describe('fundus item marks', () => {
  it('grades a photograph item against its snapshot: one eye, no case, approximate placement', () => {
    const pictures = fundusItemPictures(photoConfig, null)
    expect(pictures).toMatchObject({ eyes: ['RE'], presentation: null, photo: { imageUrl: '/api/fundus/photos/7/image', width: 640, height: 480, eye: 'RE' }, approximate: true })
    // the browser-facing part carries no reference point
    expect(JSON.stringify(pictures.photo)).not.toMatch(/430|245|7\.1/)
    // atan(34/200) = 9.6°, 2.5° off: more than twice the 1° tolerance → 0; the finding (within normal) is right
    const result = gradeFundusItem(photoConfig, pictures, { RE: { disc: { x: 430, y: 220 }, fovea: { x: 230, y: 254 }, finding: 'within-normal' } })
    const marks = fundusMarksOf(result, photoConfig.weights)
    expect(marks.map(m => [m.criterion, m.score, m.weight])).toEqual([['fundusAngle', 0, 3], ['fundusFinding', 1, 1]])
    expect(pointsOf(marks)).toEqual({ earned: 1, possible: 4 })
  })

  it('averages the two eyes of a case item and lets an override replace a criterion', () => {
    const result = {
      eyes: {
        RE: { marks: [{ criterion: 'angle', eye: 'RE', score: 1, weight: 1, reason: 'a' }, { criterion: 'finding', eye: 'RE', score: 0, weight: 1, reason: 'b' }] },
        LE: { marks: [{ criterion: 'angle', eye: 'LE', score: 0.5, weight: 1, reason: 'c' }, { criterion: 'finding', eye: 'LE', score: 1, weight: 1, reason: 'd' }] },
      },
    } as unknown as Parameters<typeof fundusMarksOf>[0]
    const marks = fundusMarksOf(result, { fundusAngle: 2, fundusFinding: 2 })
    expect(marks).toEqual([
      { criterion: 'fundusAngle', score: 0.75, weight: 2, reason: 'RE: a LE: c' },
      { criterion: 'fundusFinding', score: 0.5, weight: 2, reason: 'RE: b LE: d' },
    ])
    const changed = applyOverrides(marks, [{ attempt_id: 1, criterion: 'fundusFinding', previous_score: 0.5, score: 1, reason: 'fair', created_at: '2026-01-01T00:00:00Z', actorName: 'T' }])
    expect(pointsOf(changed)).toEqual({ earned: 1.5 + 2, possible: 4 })
  })

  it('keeps only the criteria of the item kind when resolving weights', () => {
    expect(Object.keys(resolveWeights({ fundusAngle: 5 }, undefined, 'fundus'))).toEqual(['fundusAngle', 'fundusFinding'])
    expect(resolveWeights({ fundusAngle: 5 }, undefined, 'fundus').fundusAngle).toBe(5)
    expect(Object.keys(resolveWeights(undefined))).not.toContain('fundusAngle')
  })
})
