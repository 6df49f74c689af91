// The secrecy boundary for fundus pictures: the browser gets the geometry it must
// draw and an opaque look key — never the torsion, the normal-eye angle, the angle
// itself or a finding.

import type { FundusPicture, FundusPresentation } from '#shared/engine/fundus/picture'
import { FUNDUS_PRESENTATION_VERSION } from '#shared/engine/fundus/picture'
import type { FundusTruth } from './generate'

const pictureOnly = (p: FundusPicture): FundusPicture => ({
  eye: p.eye,
  frame: { ...p.frame },
  field: { ...p.field },
  disc: { ...p.disc },
  fovea: { ...p.fovea },
  lookKey: p.lookKey,
})

export function toFundusPresentation(truth: FundusTruth): FundusPresentation {
  return {
    fundusPresentationVersion: FUNDUS_PRESENTATION_VERSION,
    fundusVersion: truth.fundusVersion,
    eyes: { RE: pictureOnly(truth.eyes.RE.picture), LE: pictureOnly(truth.eyes.LE.picture) },
  }
}
