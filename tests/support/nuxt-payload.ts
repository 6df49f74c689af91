// Reads the payload a server-rendered Nuxt page carries (<script id="__NUXT_DATA__">)
// back into plain values, so tests can scan what the page handed the browser. The
// payload is devalue's flat form: an array whose first entry is the root, every
// other value referring to entries by index, and tagged entries (["Ref", i] …) for
// the reactive wrappers Nuxt adds; the wrappers are unwrapped here.

const SPECIAL: Record<number, unknown> = { [-1]: undefined, [-2]: undefined, [-3]: Number.NaN, [-4]: Infinity, [-5]: -Infinity, [-6]: -0 }

/** The payload script's text from a page's HTML, or null when there is none. */
export function payloadText(html: string): string | null {
  const m = html.match(/<script[^>]*id="__NUXT_DATA__"[^>]*>([\s\S]*?)<\/script>/)
  return m ? m[1]! : null
}

export function revivePayload(text: string): unknown {
  const flat = JSON.parse(text) as unknown[]
  const done = new Map<number, unknown>()
  const revive = (index: number): unknown => {
    if (index in SPECIAL) return SPECIAL[index]
    if (done.has(index)) return done.get(index)
    const v = flat[index]
    if (v === null || typeof v !== 'object') {
      done.set(index, v)
      return v
    }
    if (Array.isArray(v)) {
      if (typeof v[0] === 'string') {
        // a tagged value: Nuxt's reactive wrappers hold one value; Set/Map/Date as themselves
        const [tag, ...rest] = v as [string, ...number[]]
        let out: unknown
        if (tag === 'Set') out = rest.map(revive)
        else if (tag === 'Map') out = Object.fromEntries(rest.reduce<unknown[][]>((acc, x, i) => (i % 2 ? acc : [...acc, [revive(x), revive(rest[i + 1]!)]]), []))
        else if (tag === 'Date') out = rest[0]
        else if (tag === 'EmptyRef' || tag === 'EmptyShallowRef') out = JSON.parse(String(revive(rest[0]!) ?? 'null'))
        else out = revive(rest[0]!)
        done.set(index, out)
        return out
      }
      const arr: unknown[] = []
      done.set(index, arr)
      for (const i of v as number[]) arr.push(revive(i))
      return arr
    }
    const obj: Record<string, unknown> = {}
    done.set(index, obj)
    for (const [k, i] of Object.entries(v as Record<string, number>)) obj[k] = revive(i)
    return obj
  }
  return revive(0)
}
