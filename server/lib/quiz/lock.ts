// One request at a time per key (e.g. a student's submission on one item), so a
// double click cannot slip a second attempt past the "attempts allowed" check.
// The server is one process over one SQLite file, so an in-process queue suffices.
const tails = new Map<string, Promise<unknown>>()

export async function withKeyLock<T>(key: string, work: () => Promise<T>): Promise<T> {
  const before = tails.get(key) ?? Promise.resolve()
  const run = before.catch(() => {}).then(work)
  const tail = run.catch(() => {})
  tails.set(key, tail)
  try {
    return await run
  }
  finally {
    if (tails.get(key) === tail) tails.delete(key)
  }
}
