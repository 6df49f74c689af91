// The casebook as the staff pages see it: the engine's templates (read-only),
// tutors' narrowed templates and hand-authored exact cases.
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { CaseSpec } from '#shared/engine/case-spec'
import type { NarrowedRanges } from '#shared/schemas/casebook'
import type { Database } from '~~/db/schema'
import { CASE_TEMPLATES, getCaseTemplate } from '~~/server/lib/engine/templates'

/** Lecturers see and edit every casebook; a tutor their own. */
export const seesEveryCasebook = (user: SessionUserData) => user.role === 'lecturer' || user.role === 'admin'

export function engineTemplateList() {
  return CASE_TEMPLATES.map(t => ({
    id: t.id,
    label: t.label,
    condition: t.condition,
    difficulty: t.difficulty,
    side: t.side,
    sideFromSeed: t.sideFromSeed,
    torsion: { range: [...t.ranges.torsion] as [number, number], of: t.ranges.torsionOf },
    vertical: [...t.ranges.vertical] as [number, number],
    sources: t.sources,
  }))
}

export function templateOut(r: { id: number, title: string, template_id: string, ranges_json: string, tolerance: number, notes: string | null, archived_at: string | null, owner_id: number, updated_at: string, ownerName?: string | null }) {
  return {
    id: r.id,
    title: r.title,
    templateId: r.template_id,
    templateLabel: getCaseTemplate(r.template_id)?.label ?? r.template_id,
    ranges: JSON.parse(r.ranges_json) as NarrowedRanges,
    tolerance: r.tolerance,
    notes: r.notes,
    archived: r.archived_at !== null,
    ownerId: r.owner_id,
    ownerName: r.ownerName ?? null,
    updatedAt: r.updated_at,
  }
}

export function caseOut(r: { id: number, title: string, spec_json: string, tolerance: number, archived_at: string | null, owner_id: number, updated_at: string, ownerName?: string | null }) {
  return {
    id: r.id,
    title: r.title,
    spec: JSON.parse(r.spec_json) as CaseSpec,
    tolerance: r.tolerance,
    archived: r.archived_at !== null,
    ownerId: r.owner_id,
    ownerName: r.ownerName ?? null,
    updatedAt: r.updated_at,
  }
}

export async function casebookTemplateFor(db: Kysely<Database>, user: SessionUserData, id: number) {
  let q = db.selectFrom('casebook_templates').selectAll().where('id', '=', id)
  if (!seesEveryCasebook(user)) q = q.where('owner_id', '=', user.id)
  return q.executeTakeFirst()
}

export async function casebookCaseFor(db: Kysely<Database>, user: SessionUserData, id: number) {
  let q = db.selectFrom('casebook_cases').selectAll().where('id', '=', id)
  if (!seesEveryCasebook(user)) q = q.where('owner_id', '=', user.id)
  return q.executeTakeFirst()
}
