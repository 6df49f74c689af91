// One place for "now", so tokens and windows are computed the same way everywhere.
export function nowIso(date: Date = new Date()): string {
  return date.toISOString()
}

export function addMinutes(iso: string, minutes: number): string {
  return new Date(Date.parse(iso) + minutes * 60_000).toISOString()
}
