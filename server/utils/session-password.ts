// Start-up check of NUXT_SESSION_PASSWORD in production: long enough (32+
// characters, as nuxt-auth-utils requires for its sealed cookies), and not long
// but trivially weak — one character or a short pattern repeated, or too few
// different characters to have come from a random generator.

export const SESSION_PASSWORD_MIN_LENGTH = 32
/** 32 random hex digits show fewer than 8 different ones about 4 times in 100 million. */
export const SESSION_PASSWORD_MIN_DISTINCT = 8

/** The shortest block that, repeated, makes up the whole text (the text itself if none). */
export function repeatingBlock(text: string): string {
  for (let size = 1; size <= text.length / 2; size++) {
    const block = text.slice(0, size)
    let repeats = true
    for (let i = size; i < text.length; i++) {
      if (text[i] !== block[i % size]) {
        repeats = false
        break
      }
    }
    if (repeats) return block
  }
  return text
}

/** Why the session password is refused, or null when it will do. */
export function sessionPasswordProblem(password: string): string | null {
  if (password.length < SESSION_PASSWORD_MIN_LENGTH) {
    return `NUXT_SESSION_PASSWORD must be set to at least ${SESSION_PASSWORD_MIN_LENGTH} characters in production.`
  }
  const block = repeatingBlock(password)
  if (block.length < password.length) {
    return `NUXT_SESSION_PASSWORD is one short pattern (${block.length} character${block.length === 1 ? '' : 's'}) repeated: use a random value, e.g. \`openssl rand -hex 32\`.`
  }
  const distinct = new Set(password).size
  if (distinct < SESSION_PASSWORD_MIN_DISTINCT) {
    return `NUXT_SESSION_PASSWORD uses only ${distinct} different characters: use a random value, e.g. \`openssl rand -hex 32\`.`
  }
  return null
}
