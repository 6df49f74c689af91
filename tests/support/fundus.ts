// Test helpers for the fundus features: practice cases through the practice API,
// row counts read from the test server's database, and small synthetic fundus
// photographs drawn with sharp, with a known disc centre and fovea.
import sharp from 'sharp'
import type { Client } from './client'
import { readDb } from './db'

/** Start a practice case through the practice API, as a learner would. */
export async function startPracticeCase(client: Client, template: string, difficulty: 'standard' | 'challenging', seed: string): Promise<number> {
  const reply = await client.post<{ id: number }>('/api/practice', { template, difficulty, seed })
  if (reply.status !== 201) throw new Error(`could not start a practice case: ${reply.status} ${JSON.stringify(reply.body)}`)
  return reply.body.id
}

/** Record a double Maddox rod result on the case through the practice API. */
export async function recordDmr(client: Client, caseId: number): Promise<void> {
  const reply = await client.post(`/api/practice/${caseId}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'DMR, near, primary position: RE no torsion, LE no torsion.' })
  if (reply.status !== 201) throw new Error(`could not record an attempt: ${reply.status} ${JSON.stringify(reply.body)}`)
}

export function countRows(dbPath: string, table: 'fundus_photos' | 'fundus_attempts' | 'fundus_photo_cohorts'): number {
  const db = readDb(dbPath)
  try {
    return db.count(`select count(*) as n from ${table}`)
  }
  finally {
    db.close()
  }
}

export interface SyntheticPhoto {
  width: number
  height: number
  disc: { x: number, y: number }
  fovea: { x: number, y: number }
}

/** An upright right-eye fundus: disc on the right, fovea to its left and lower. */
export const SYNTHETIC_PHOTO: SyntheticPhoto = { width: 640, height: 480, disc: { x: 430, y: 220 }, fovea: { x: 230, y: 245 } }

function svgFor(p: SyntheticPhoto): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${p.width}" height="${p.height}">
    <rect width="100%" height="100%" fill="#000"/>
    <circle cx="${p.width / 2}" cy="${p.height / 2}" r="${p.height / 2 - 4}" fill="#c2552c"/>
    <circle cx="${p.fovea.x}" cy="${p.fovea.y}" r="60" fill="#8f3418" opacity="0.6"/>
    <circle cx="${p.fovea.x}" cy="${p.fovea.y}" r="6" fill="#5a1d0c"/>
    <ellipse cx="${p.disc.x}" cy="${p.disc.y}" rx="36" ry="40" fill="#f2d08a"/>
  </svg>`
}

export const syntheticPng = (p: SyntheticPhoto = SYNTHETIC_PHOTO): Promise<Buffer> => sharp(Buffer.from(svgFor(p))).png().toBuffer()

/** A JPEG carrying EXIF that identifies someone — what must never be stored. */
export const jpegWithExif = (p: SyntheticPhoto = SYNTHETIC_PHOTO): Promise<Buffer> =>
  sharp(Buffer.from(svgFor(p))).jpeg().withExif({
    IFD0: { ImageDescription: 'Patient Ada Exemplar DOB 01-02-1970', Artist: 'Clinic camera 7', Copyright: 'Identifying text' },
  }).toBuffer()
