// What a fundus marker draws: a generated case's procedural picture (units: disc
// diameters) or an uploaded photograph (units: image pixels).
import type { Eye } from '../types'
import type { FundusPicture } from './picture'

export type FundusSource
  = | { kind: 'picture', picture: FundusPicture }
    | { kind: 'image', url: string, width: number, height: number, eye: Eye }

export const sourceEye = (s: FundusSource): Eye => (s.kind === 'picture' ? s.picture.eye : s.eye)

export const sourceSize = (s: FundusSource): { width: number, height: number } =>
  s.kind === 'picture' ? s.picture.frame : { width: s.width, height: s.height }
