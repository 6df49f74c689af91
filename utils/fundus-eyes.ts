// Per-eye marking state for a fundus page: the two marks, which one moves next,
// and the recorded finding.
import type { Point } from '#shared/engine/fundus/geometry'
import { discFoveaAngle } from '#shared/engine/fundus/geometry'
import type { FundusFinding } from '#shared/engine/fundus/normals'
import type { Eye } from '#shared/engine/types'

export interface FundusEyeState {
  disc: Point | null
  fovea: Point | null
  active: 'disc' | 'fovea'
  finding: FundusFinding | null
}

export const emptyFundusEye = (): FundusEyeState => ({ disc: null, fovea: null, active: 'disc', finding: null })

export const fundusEyeComplete = (s: FundusEyeState): boolean => !!(s.disc && s.fovea && s.finding)

export const fundusEyeAngle = (eye: Eye, s: FundusEyeState): number | null =>
  s.disc && s.fovea ? discFoveaAngle(eye, s.disc, s.fovea) : null

export const EYE_LABELS: Record<Eye, string> = { RE: 'right eye (RE)', LE: 'left eye (LE)' }
