// A 2D context that records what is drawn, for tests of canvas drawing. Happy DOM
// has no canvas; this stands in for one and lets a test ask "was the rod drawn at
// this angle?" instead of comparing pixels.

export interface DrawCall { fn: string, args: unknown[] }

export interface RecordingContext {
  ctx: CanvasRenderingContext2D
  calls: DrawCall[]
  /** Every `lineTo` target since the last `clear()`. */
  lineTos: () => { x: number, y: number }[]
  clear: () => void
}

export function recordingContext(): RecordingContext {
  const calls: DrawCall[] = []
  const state: Record<string | symbol, unknown> = {}
  const ctx = new Proxy({} as CanvasRenderingContext2D, {
    get(_, key) {
      if (key in state) return state[key]
      if (key === 'then') return undefined
      return (...args: unknown[]) => {
        calls.push({ fn: String(key), args })
      }
    },
    set(_, key, value) {
      state[key] = value
      calls.push({ fn: `set ${String(key)}`, args: [value] })
      return true
    },
  })
  return {
    ctx,
    calls,
    lineTos: () => calls.filter(c => c.fn === 'lineTo').map(c => ({ x: c.args[0] as number, y: c.args[1] as number })),
    clear: () => {
      calls.length = 0
    },
  }
}
