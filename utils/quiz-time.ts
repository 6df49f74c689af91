// Dates and durations on quiz pages. The server stores and enforces UTC; pages
// show local time (formatWhen in utils/format-dates.ts) and edit it through
// <input type="datetime-local">.
const pad = (n: number) => String(n).padStart(2, '0')

/** ISO → the value a datetime-local input shows (local time, minutes). */
export function toLocalInput(iso: string | null | undefined): string {
  if (!iso) return ''
  const d = new Date(iso)
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`
}

/** A datetime-local value → ISO (UTC), or null when empty or unreadable. */
export function fromLocalInput(value: string): string | null {
  if (!value) return null
  const d = new Date(value)
  return Number.isNaN(d.getTime()) ? null : d.toISOString()
}

export function formatDuration(ms: number | null | undefined): string {
  if (ms === null || ms === undefined) return '—'
  const total = Math.max(0, Math.round(ms / 1000))
  // minutes and seconds, however long (a sitting is counted in minutes): "12 min 05 s", "75 min 00 s"
  const m = Math.floor(total / 60)
  const s = total % 60
  return m ? `${m} min ${pad(s)} s` : `${s} s`
}

export const PHASE_LABELS = { draft: 'Draft', upcoming: 'Scheduled', open: 'Open', closed: 'Closed' } as const
export const STATUS_LABELS = { 'not-started': 'Not started', 'in-progress': 'In progress', 'finished': 'Finished' } as const
