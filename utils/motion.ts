/** Whether the person has asked their system for less motion (the prefers-reduced-motion media feature). */
export function prefersReducedMotion(): boolean {
  return import.meta.client && typeof window.matchMedia === 'function' && window.matchMedia('(prefers-reduced-motion: reduce)').matches
}

/** 'smooth' unless motion is to be reduced: pass to scrollIntoView / scrollTo. */
export function scrollBehaviour(): ScrollBehavior {
  return prefersReducedMotion() ? 'auto' : 'smooth'
}
