// The photograph as a person sees it in the library: learners never get the
// reference marks (they would be the answer).
import type { SessionUserData } from '#shared/auth/roles'
import type { FundusPhotoView } from '#shared/types/fundus'
import type { FundusPhotoRow } from '~~/db/schema'
import { managesFundusPhoto } from './photo-access'

export async function fundusPhotoViews(user: SessionUserData, rows: FundusPhotoRow[]): Promise<FundusPhotoView[]> {
  if (!rows.length) return []
  const db = await useDb()
  const ids = rows.map(r => r.id)
  const cohorts = await db.selectFrom('fundus_photo_cohorts as pc').innerJoin('cohorts as c', 'c.id', 'pc.cohort_id')
    .select(['pc.photo_id', 'c.id', 'c.name']).where('pc.photo_id', 'in', ids).orderBy('c.name').execute()
  const ownerIds = [...new Set(rows.map(r => r.owner_id).filter((v): v is number => v !== null))]
  const owners = ownerIds.length ? await db.selectFrom('users').select(['id', 'name']).where('id', 'in', ownerIds).execute() : []
  const staff = user.role !== 'student'
  return rows.map((r) => {
    const canManage = managesFundusPhoto(user, r)
    const marked = r.reference_angle !== null
    return {
      id: r.id,
      title: r.title,
      eye: r.eye,
      width: r.width,
      height: r.height,
      imageUrl: `/api/fundus/photos/${r.id}/image`,
      marked,
      reference: staff && marked ? { disc: { x: r.disc_x!, y: r.disc_y! }, fovea: { x: r.fovea_x!, y: r.fovea_y! }, angle: r.reference_angle! } : null,
      notes: staff ? r.notes : null,
      ownerName: owners.find(o => o.id === r.owner_id)?.name ?? null,
      mine: r.owner_id === user.id,
      canManage,
      cohorts: cohorts.filter(c => c.photo_id === r.id).map(c => ({ id: c.id, name: c.name })),
      createdAt: r.created_at,
    }
  })
}
