// A hand-authored case (a tutor's exact numbers), validated before it goes
// through the same shape as a generated case. Browser-safe so the casebook form
// can validate as the tutor types; the finished case itself stays on the server.

import { z } from 'zod'
import { eyeSchema, gazeSchema, signedTorsionSchema } from './schemas'
import { GAZES, MUSCLES } from './types'

export const CONDITIONS = [
  'normal',
  'so-palsy',
  'bilateral-so-palsy',
  'io-palsy',
  'sr-palsy',
  'ir-palsy',
  'ted-ir-restriction',
  'skew-deviation',
  'long-standing-so-palsy',
  'suppression',
  'hand-authored',
] as const
export type Condition = (typeof CONDITIONS)[number]

export const BEHAVIOURS = ['under-reports', 'one-streak-only', 'intermittent-one-streak'] as const
export type Behaviour = (typeof BEHAVIOURS)[number]

const prismDioptres = (what: string) =>
  z
    .number({ error: `${what} must be a number of prism dioptres.` })
    .finite()
    .min(-60, { error: `${what} beyond 60 Δ is not plausible.` })
    .max(60, { error: `${what} beyond 60 Δ is not plausible.` })

const perEyeTorsion = z.object({ RE: signedTorsionSchema, LE: signedTorsionSchema })

export const findingSpecSchema = z.object({
  /** Objective (true) torsion, signed degrees, positive = excyclo. */
  torsion: perEyeTorsion,
  /** What the double Maddox rod shows, if different (sensory adaptation). Defaults to `torsion`. */
  reported: perEyeTorsion.optional(),
  /** Δ, positive = right eye higher (R/L). */
  vertical: prismDioptres('Vertical deviation').default(0),
  /** Δ, positive = eso, negative = exo; one number for both distances, or each. */
  horizontal: z
    .union([prismDioptres('Horizontal deviation'), z.object({ near: prismDioptres('Near deviation'), distance: prismDioptres('Distance deviation') })])
    .default(0),
})
export type FindingSpec = z.input<typeof findingSpecSchema>

export const caseSpecSchema = z
  .object({
    label: z.string().max(120, { error: 'Keep the label under 120 characters.' }).optional(),
    condition: z.enum(CONDITIONS, { error: `Condition must be one of: ${CONDITIONS.join(', ')}.` }).default('hand-authored'),
    affectedEye: eyeSchema.optional(),
    /** The palsied muscle(s), so the three-step interpretation can be marked. */
    palsiedMuscles: z.array(z.enum(MUSCLES, { error: `Muscles are: ${MUSCLES.join(', ')}.` })).max(2).default([]),
    fixingEye: eyeSchema.default('RE'),
    /** Findings in primary position (required) and in any other position; missing positions copy primary. */
    gazes: z
      .partialRecord(gazeSchema, findingSpecSchema)
      .refine(g => g.primary !== undefined, { error: 'Give the findings in primary position.' }),
    headTilt: z.object({ right: prismDioptres('Head-tilt deviation'), left: prismDioptres('Head-tilt deviation') }).optional(),
    supine: prismDioptres('Supine deviation').optional(),
    response: z.object({
      reliabilitySd: z
        .number({ error: 'Reliability must be a standard deviation in degrees.' })
        .min(0, { error: 'Reliability cannot be negative.' })
        .max(5, { error: 'A scatter above 5° would make the case unusable.' }),
      parallelThreshold: z
        .number({ error: 'The parallel threshold must be in degrees.' })
        .min(0.2, { error: 'No patient tells lines apart below 0.2°.' })
        .max(5, { error: 'A threshold above 5° would make the case unusable.' }),
      behaviours: z.array(z.enum(BEHAVIOURS, { error: `Behaviours are: ${BEHAVIOURS.join(', ')}.` })).default([]),
      seenEye: eyeSchema.optional(),
    }),
    opening: z.string().max(400).optional(),
  })
  .superRefine((spec, ctx) => {
    const b = spec.response.behaviours
    if (b.includes('one-streak-only') && b.includes('intermittent-one-streak')) {
      ctx.addIssue({ code: 'custom', path: ['response', 'behaviours'], message: 'A patient cannot both never and sometimes see the second streak.' })
    }
    if ((b.includes('one-streak-only') || b.includes('intermittent-one-streak')) && !spec.response.seenEye) {
      ctx.addIssue({ code: 'custom', path: ['response', 'seenEye'], message: 'Say whose streak the patient sees.' })
    }
    if (spec.condition === 'suppression' && !(b.includes('one-streak-only') || b.includes('intermittent-one-streak'))) {
      ctx.addIssue({ code: 'custom', path: ['response', 'behaviours'], message: 'A suppression case needs a one-streak behaviour.' })
    }
    for (const g of GAZES) {
      const f = spec.gazes[g]
      if (!f) continue
      if (b.includes('under-reports') && f.reported) {
        for (const e of ['RE', 'LE'] as const) {
          if (Math.abs(f.reported[e]) > Math.abs(f.torsion[e]) + 0.5) {
            ctx.addIssue({
              code: 'custom',
              path: ['gazes', g, 'reported', e],
              message: 'An under-reporting patient cannot report more torsion than the eye has.',
            })
          }
        }
      }
    }
  })
export type CaseSpec = z.input<typeof caseSpecSchema>
export type CaseSpecParsed = z.output<typeof caseSpecSchema>
