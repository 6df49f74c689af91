// Outgoing e-mail. Every message is first written to mail_jobs, then sent; a
// failed send is logged and retried with back-off by the mail plugin, so an
// invitation or reset record is never lost because the SMTP server hiccupped.
// Whoever sends a job first takes a lease on it (lease_until, lease_owner): with
// several instances retrying the same table, a job is sent by one of them only.
// A lease that outlives its instance (a crash mid-send) expires after
// MAIL_LEASE_SECONDS and the job is tried again: at least once, never twice at once.
import { randomUUID } from 'node:crypto'
import nodemailer from 'nodemailer'
import type { Transporter } from 'nodemailer'
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { dialectOf } from '~~/db/dialect'

export interface MailMessage { to: string, subject: string, text: string, html?: string }

export const MAX_MAIL_ATTEMPTS = 8
/** How long one instance holds a job it is sending (longer than any SMTP timeout). */
export const MAIL_LEASE_SECONDS = 300
/** This process, as a lease owner. */
const INSTANCE = randomUUID()

let transporter: Transporter | null = null
let catcherPort: number | null = null

/** Set by the mail-catcher plugin once its SMTP server listens. */
export function useCatcherPort(port: number): void {
  catcherPort = port
  transporter = null
}

export function mailCatcherEnabled(): boolean {
  const flag = String(useRuntimeConfig().mailCatcher ?? '')
  if (flag === '1' || flag === 'true') return true
  if (flag === '0' || flag === 'false') return false
  return import.meta.dev
}

function transport(): Transporter | null {
  if (transporter) return transporter
  if (mailCatcherEnabled()) {
    if (!catcherPort) return null
    transporter = nodemailer.createTransport({ host: '127.0.0.1', port: catcherPort, secure: false, ignoreTLS: true })
    return transporter
  }
  const url = process.env.SMTP_URL || String(useRuntimeConfig().smtpUrl || '')
  if (!url) return null
  transporter = nodemailer.createTransport(url)
  return transporter
}

export function retryDelaySeconds(attempts: number, baseSeconds: number): number {
  return Math.min(3600, baseSeconds * 2 ** Math.max(0, attempts - 1))
}

/**
 * Takes the lease on one pending job, or says someone else holds it. A single
 * conditional UPDATE: on PostgreSQL a competing instance's UPDATE waits for the
 * row and then re-checks the condition (READ COMMITTED), on SQLite writes run one
 * at a time, so exactly one caller gets a row back.
 */
export async function claimMailJob(db: Kysely<Database>, jobId: number, now = new Date()): Promise<boolean> {
  const at = now.toISOString()
  const result = await db.updateTable('mail_jobs')
    .set({ lease_until: new Date(now.getTime() + MAIL_LEASE_SECONDS * 1000).toISOString(), lease_owner: INSTANCE })
    .where('id', '=', jobId).where('status', '=', 'pending')
    .where(eb => eb.or([eb('lease_until', 'is', null), eb('lease_until', '<', at)]))
    .executeTakeFirst()
  return Number(result.numUpdatedRows) === 1
}

/**
 * Claims up to `limit` due jobs at once and returns their ids. On PostgreSQL the
 * candidates are picked FOR UPDATE SKIP LOCKED, so instances retrying at the same
 * moment take different jobs instead of queueing on the same rows.
 */
export async function claimDueMailJobs(db: Kysely<Database>, limit = 50, now = new Date()): Promise<number[]> {
  const at = now.toISOString()
  const rows = await db.updateTable('mail_jobs')
    .set({ lease_until: new Date(now.getTime() + MAIL_LEASE_SECONDS * 1000).toISOString(), lease_owner: INSTANCE })
    .where('status', '=', 'pending')
    .where(eb => eb.or([eb('lease_until', 'is', null), eb('lease_until', '<', at)]))
    .where('id', 'in', eb => eb.selectFrom('mail_jobs').select('id')
      .where('status', '=', 'pending').where('next_attempt_at', '<=', at)
      .where(w => w.or([w('lease_until', 'is', null), w('lease_until', '<', at)]))
      .orderBy('id').limit(limit)
      .$if(dialectOf(db) === 'postgres', qb => qb.forUpdate().skipLocked()))
    .returning('id').execute()
  return rows.map(r => r.id).sort((a, b) => a - b)
}

/** Sends a job this instance holds the lease on, and records the outcome (which frees the lease). */
async function deliverClaimed(db: Kysely<Database>, jobId: number): Promise<boolean> {
  const job = await db.selectFrom('mail_jobs').selectAll().where('id', '=', jobId).executeTakeFirst()
  if (!job || job.status !== 'pending' || job.lease_owner !== INSTANCE) return false
  const t = transport()
  const attempts = job.attempts + 1
  try {
    if (!t) throw new Error('No mail transport is configured (set SMTP_URL, or NUXT_MAIL_CATCHER=1 for development).')
    await t.sendMail({
      from: String(useRuntimeConfig().mailFrom),
      to: job.to_address,
      subject: job.subject,
      text: job.text_body,
      html: job.html_body ?? undefined,
    })
    await db.updateTable('mail_jobs')
      .set({ status: 'sent', attempts, sent_at: nowIso(), last_error: null, lease_until: null, lease_owner: null })
      .where('id', '=', jobId).execute()
    return true
  }
  catch (error) {
    const message = error instanceof Error ? error.message : String(error)
    console.warn(`[mail] job ${jobId} to ${job.to_address} failed (attempt ${attempts}): ${message}`)
    await db.updateTable('mail_jobs').set({
      status: attempts >= MAX_MAIL_ATTEMPTS ? 'failed' : 'pending',
      attempts,
      last_error: message,
      next_attempt_at: new Date(Date.now() + 1000 * retryDelaySeconds(attempts, Number(useRuntimeConfig().mailRetrySeconds) || 30)).toISOString(),
      lease_until: null,
      lease_owner: null,
    }).where('id', '=', jobId).execute()
    return false
  }
}

async function deliver(db: Kysely<Database>, jobId: number): Promise<boolean> {
  if (!(await claimMailJob(db, jobId))) return false
  return deliverClaimed(db, jobId)
}

/** Queues a message and tries to send it at once; never throws for a send failure. */
export async function sendMail(message: MailMessage): Promise<{ jobId: number, sent: boolean }> {
  const db = await useDb()
  const now = nowIso()
  const { id } = await db.insertInto('mail_jobs').values({
    to_address: message.to,
    subject: message.subject,
    text_body: message.text,
    html_body: message.html ?? null,
    status: 'pending',
    attempts: 0,
    next_attempt_at: now,
    created_at: now,
  }).returning('id').executeTakeFirstOrThrow()
  const sent = await deliver(db, id)
  return { jobId: id, sent }
}

/** Retries every pending job that is due. Returns how many were sent. */
export async function deliverDueMail(): Promise<number> {
  const db = await useDb()
  let sent = 0
  for (const id of await claimDueMailJobs(db)) if (await deliverClaimed(db, id)) sent++
  return sent
}

/**
 * The configured site origin (NUXT_PUBLIC_SITE_URL), or null when it is unset
 * or not an http(s) URL. Links in e-mails never come from the request: a forged
 * Host or X-Forwarded-Host header must not be able to point a reset link at
 * someone else's site.
 */
export function configuredSiteOrigin(raw: unknown = useRuntimeConfig().public.siteUrl): string | null {
  const text = String(raw ?? '').trim()
  if (!text) return null
  try {
    const url = new URL(text)
    if (url.protocol !== 'http:' && url.protocol !== 'https:') return null
    return `${url.origin}${url.pathname}`.replace(/\/+$/, '')
  }
  catch {
    return null
  }
}

/** The development server's own origin, from the same settings `nuxt dev` listens on. */
function devServerOrigin(): string {
  const port = process.env.NUXT_PORT || process.env.NITRO_PORT || process.env.PORT || '3000'
  const host = process.env.NUXT_HOST || process.env.NITRO_HOST || process.env.HOST || 'localhost'
  return `http://${host.includes(':') ? `[${host}]` : host}:${port}`
}

/**
 * The origin links in e-mails point at: NUXT_PUBLIC_SITE_URL; in development
 * without it, the dev server's own origin. Never the request's Host or
 * X-Forwarded-* headers (the event is accepted only for older callers).
 * Production refuses to start without the setting (server/plugins/0.startup.ts).
 */
export function siteOrigin(_event?: import('h3').H3Event): string {
  const configured = configuredSiteOrigin()
  if (configured) return configured
  if (import.meta.dev) return devServerOrigin()
  throw createError({ statusCode: 500, statusMessage: 'Server Misconfigured', message: 'NUXT_PUBLIC_SITE_URL is not set.' })
}
