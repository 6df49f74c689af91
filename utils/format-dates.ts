// One way to write dates and times everywhere: in the reader's locale. The locale is
// decided once per visit (plugins/date-locale.ts: the browser's Accept-Language on the
// server, carried to the browser in the payload), so a page hydrates with the same words.
export const DATE_FALLBACK_LOCALE = 'en-GB'

/** The first usable language tag of an Accept-Language header (or navigator.language). */
export function pickDateLocale(header: string | null | undefined): string {
  for (const part of (header ?? '').split(',')) {
    const tag = part.split(';')[0]!.trim()
    if (!tag || tag === '*') continue
    try {
      if (Intl.DateTimeFormat.supportedLocalesOf([tag]).length) return tag
    }
    catch {
      // not a well-formed tag: try the next
    }
  }
  return DATE_FALLBACK_LOCALE
}

function readerLocale(): string {
  return (tryUseNuxtApp()?.$dateLocale as string | undefined) ?? DATE_FALLBACK_LOCALE
}

const fmt = (iso: string | null | undefined, options: Intl.DateTimeFormatOptions): string => {
  if (!iso) return '—'
  const d = new Date(iso)
  return Number.isNaN(d.getTime()) ? '—' : d.toLocaleString(readerLocale(), options)
}

/** Date and time: "2 Dec 2026, 14:05" (en-GB), "Dec 2, 2026, 2:05 PM" (en-US)… */
export const formatWhen = (iso: string | null | undefined): string => fmt(iso, { dateStyle: 'medium', timeStyle: 'short' })
/** The date alone. */
export const formatDay = (iso: string | null | undefined): string => fmt(iso, { dateStyle: 'medium' })
/** The time alone, with seconds (autosave). */
export const formatTime = (iso: string | null | undefined): string => fmt(iso, { timeStyle: 'medium' })
/** A week's first day on a chart axis: day and short month, as stored (UTC). */
export const formatWeek = (day: string): string => fmt(`${day}T00:00:00Z`, { day: 'numeric', month: 'short', timeZone: 'UTC' })
