// Presentations made by the torsion engine itself, for bench tests: the bench is
// driven by exactly what the server would send.
import type { Mode } from '#shared/engine/types'
import { generateCase } from '~~/server/lib/engine/generator'
import { toPresentation } from '~~/server/lib/engine/presentation'

export function engineCase(template = 'so-palsy-right', seed = 'bench-fixture-1', mode: Mode = 'learner-turns') {
  const c = generateCase(template, seed)
  return { case: c, presentation: toPresentation(c, mode) }
}
