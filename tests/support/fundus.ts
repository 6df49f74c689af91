// Test helpers for the fundus features: practice cases written straight into the
// test server's SQLite file (the same rows the practice routes write), and small
// synthetic fundus photographs drawn with sharp, with known disc and fovea.
import Database from 'better-sqlite3'
import sharp from 'sharp'
import { GENERATOR_VERSION, generateCase } from '~~/server/utils/engine/generator'

function withDb<T>(dbPath: string, work: (db: Database.Database) => T): T {
  const db = new Database(dbPath)
  db.pragma('busy_timeout = 5000')
  try {
    return work(db)
  }
  finally {
    db.close()
  }
}

export function userId(dbPath: string, email: string): number {
  return withDb(dbPath, db => (db.prepare('select id from users where email = ?').get(email) as { id: number }).id)
}

/** A practice case owned by `email`, as the practice routes store one. */
export function insertPracticeCase(dbPath: string, email: string, templateId: string, seed: string, purpose = 'practice'): number {
  const c = generateCase(templateId, seed)
  const now = new Date().toISOString()
  return withDb(dbPath, (db) => {
    const owner = (db.prepare('select id from users where email = ?').get(email) as { id: number }).id
    const info = db.prepare(`insert into cases (owner_id, purpose, template_id, template_hidden, seed, generator_version, condition, difficulty, mode, read_scale, trial_count, created_at, updated_at)
      values (?, ?, ?, 0, ?, ?, ?, ?, 'learner-turns', 0, 0, ?, ?)`).run(owner, purpose, templateId, seed, GENERATOR_VERSION, c.condition, c.difficulty ?? 'standard', now, now)
    return Number(info.lastInsertRowid)
  })
}

/** A minimal double Maddox rod attempt on a case (what recordAttempt stores), so the case counts as recorded. */
export function insertDmrAttempt(dbPath: string, caseId: number): void {
  const now = new Date().toISOString()
  withDb(dbPath, (db) => {
    const row = db.prepare('select owner_id, template_id, seed, generator_version, condition, difficulty, mode from cases where id = ?').get(caseId) as Record<string, unknown>
    db.prepare(`insert into attempts (case_id, learner_id, cohort_id, kind, template_id, condition, difficulty, mode, seed, generator_version, gaze, distance,
      readings_json, prisms_json, record_text, parsed_json, marks_json, score, points_earned, points_possible, slips_json, truth_json, submitted_at)
      values (?, ?, null, 'practice', ?, ?, ?, ?, ?, ?, 'primary', 'near', '{"RE":90,"LE":90}', '[]', 'DMR N primary: RE nil LE nil', '{}', '[]', 0, 0, 10, '[]', '{}', ?)`)
      .run(caseId, row.owner_id, row.template_id, row.condition, row.difficulty, row.mode, row.seed, row.generator_version, now)
  })
}

export function countRows(dbPath: string, table: 'fundus_photos' | 'fundus_attempts' | 'fundus_photo_cohorts'): number {
  return withDb(dbPath, db => (db.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n)
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
