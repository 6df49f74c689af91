// Left↔right mirror image of a case. Left-sided templates are generated as the
// right-sided case and mirrored, which makes mirror symmetry exact by design.

import type { Gaze, PerEye } from '#shared/engine/types'
import { GAZES, otherEye } from '#shared/engine/types'
import { MIRROR_GAZE, mirrorMuscle } from './muscles'
import type { Case, GazeFinding } from './types'

const swap = <T>(v: PerEye<T>): PerEye<T> => ({ RE: v.LE, LE: v.RE })
// keep -0 out of mirrored numbers so mirrored cases compare equal
const neg = (v: number): number => (v === 0 ? 0 : -v)

export function mirrorCase(c: Case): Case {
  const gazes = Object.fromEntries(
    GAZES.map((g): [Gaze, GazeFinding] => {
      const f = c.gazes[MIRROR_GAZE[g]]
      return [g, { torsion: swap(f.torsion), reported: swap(f.reported), vertical: neg(f.vertical), horizontal: { ...f.horizontal } }]
    }),
  ) as Record<Gaze, GazeFinding>
  const response = { ...c.response, behaviours: [...c.response.behaviours] }
  if (c.response.seenEye) response.seenEye = otherEye(c.response.seenEye)
  return {
    ...c,
    affectedEye: c.affectedEye ? otherEye(c.affectedEye) : null,
    palsiedMuscles: c.palsiedMuscles.map(mirrorMuscle),
    fixingEye: otherEye(c.fixingEye),
    gazes,
    headTilt: { right: neg(c.headTilt.left), left: neg(c.headTilt.right) },
    supine: neg(c.supine),
    response,
  }
}
