// Bodies of the casebook routes: tutors' case templates (an engine template with
// narrower ranges and a tolerance) and hand-authored exact cases.
import { z } from 'zod'
import { caseSpecSchema } from '../engine/case-spec'
import { modeSchema, seedSchema, templateIdSchema, toleranceSchema } from '../engine/schemas'

const titleField = z.string({ error: 'Give a title.' })
  .trim()
  .min(1, { error: 'Give a title.' })
  .max(120, { error: 'Keep the title under 120 characters.' })

/** [low, high], low ≤ high. */
export const rangeSchema = (what: string, unit: string) => z
  .tuple([
    z.number({ error: `${what}: the low end must be a number of ${unit}.` }).finite(),
    z.number({ error: `${what}: the high end must be a number of ${unit}.` }).finite(),
  ], { error: `${what} must be [low, high] in ${unit}.` })
  .refine(([lo, hi]) => lo <= hi, { error: `${what}: the low end must not be above the high end.` })

export const narrowedRangesSchema = z.object({
  /** Primary-position torsion, measured the way the engine template's `torsionOf` says. */
  torsion: rangeSchema('Torsion range', 'degrees').optional(),
  /** Size of the primary-position vertical deviation, Δ. */
  vertical: rangeSchema('Vertical range', 'prism dioptres').optional(),
}, { error: 'Ranges must be an object: { torsion?: [low, high], vertical?: [low, high] }.' })
export type NarrowedRanges = z.infer<typeof narrowedRangesSchema>

export const casebookTemplateBody = z.object({
  title: titleField,
  templateId: templateIdSchema,
  ranges: narrowedRangesSchema.default({}),
  tolerance: toleranceSchema.default(2),
  notes: z.string({ error: 'Notes must be text.' }).max(2000, { error: 'Keep the notes under 2000 characters.' }).optional(),
})
export type CasebookTemplateBody = z.input<typeof casebookTemplateBody>

export const casebookTemplatePatch = z.object({
  title: titleField.optional(),
  ranges: narrowedRangesSchema.optional(),
  tolerance: toleranceSchema.optional(),
  notes: z.string().max(2000, { error: 'Keep the notes under 2000 characters.' }).optional(),
  archived: z.boolean({ error: 'Archived must be true or false.' }).optional(),
}).refine(b => Object.keys(b).length > 0, { error: 'Nothing to change.' })

export const casebookCaseBody = z.object({
  title: titleField,
  spec: caseSpecSchema,
  tolerance: toleranceSchema.default(2),
})
export type CasebookCaseBody = z.input<typeof casebookCaseBody>

export const casebookCasePatch = z.object({
  title: titleField.optional(),
  spec: caseSpecSchema.optional(),
  tolerance: toleranceSchema.optional(),
  archived: z.boolean({ error: 'Archived must be true or false.' }).optional(),
}).refine(b => Object.keys(b).length > 0, { error: 'Nothing to change.' })

const positiveId = z.number({ error: 'Give the id as a number.' }).int().positive({ error: 'The id must be a positive whole number.' })

/** Where a case comes from: an engine template, a casebook template or an exact case. */
export const caseSourceSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('engine'), templateId: templateIdSchema }),
  z.object({ type: z.literal('template'), id: positiveId }),
  z.object({ type: z.literal('case'), id: positiveId }),
], { error: 'The source must be { type: "engine", templateId }, { type: "template", id } or { type: "case", id }.' })
export type CaseSource = z.infer<typeof caseSourceSchema>

export const casePreviewBody = z.object({
  source: caseSourceSchema,
  seed: seedSchema.optional(),
  mode: modeSchema.default('patient-turns'),
})
export type CasePreviewBody = z.input<typeof casePreviewBody>
