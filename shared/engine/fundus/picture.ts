// The browser-facing fundus of a generated case: the picture's geometry and
// nothing else. No torsion, no direction, no finding, no normal-eye angle: the
// learner must measure the picture. The disc and fovea positions are the picture
// itself (the browser has to draw them), exactly as a photograph would show them.

import type { Eye, PerEye } from '../types'
import type { Point } from './geometry'

export const FUNDUS_PRESENTATION_VERSION = 1

export interface FundusPicture {
  eye: Eye
  /** Picture size in disc diameters (DD): x to the viewer's right, y down. */
  frame: { width: number, height: number }
  /** The round field a fundus camera sees; outside it the picture is dark. */
  field: { x: number, y: number, radius: number }
  /** Optic disc centre and size (DD; the disc is slightly taller than wide). */
  disc: Point & { width: number, height: number }
  fovea: Point
  /** Opaque key that seeds the drawing (vessels, pigment, cup). */
  lookKey: string
}

export interface FundusPresentation {
  fundusPresentationVersion: number
  /** Version of the fundus derivation that drew these pictures. */
  fundusVersion: number
  eyes: PerEye<FundusPicture>
}
