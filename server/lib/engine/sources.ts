// Published sources behind the case templates (see clinical-facts.md for the
// full references). Kept in one place so templates and tests cite the same text.

export const TEMPLATE_SOURCES = {
  domain: 'Cyclodial domain.md §4 — case patterns per condition',
  flodin2020: 'Flodin et al., Acta Ophthalmol 2020;98:177-81 — normal subjective torsion about 1° excyclo',
  liebermann2018: 'Liebermann et al., J AAPOS 2018;22:146 — DMR test–retest 95% limits of agreement ±4.7°',
  marsh2014: 'Marsh et al., Am Orthopt J 2014;64:76-80 — apparent excyclo added by a vertical prism',
  lee2013: 'Lee et al., Korean J Ophthalmol 2013;27:39-43 — DMR 5.18 ± 4.11° in acquired unilateral SO palsy',
  almog2014: 'Almog et al., J Neuroophthalmol 2014 — mean DMR 6.7° in unilateral SO palsy',
  korean2016: 'J Korean Ophthalmol Soc 2016;57(5) — DMR 3.40° in primary vs 4.16° in downgaze (SO palsy)',
  jpos1993: 'J Pediatr Ophthalmol Strabismus 1993;30(6):361-7 — DMR in 20° downgaze; 20° separates bilateral from unilateral',
  jcm2020: 'J Clin Med 2020;9:1829 — bilateral SO palsy subjective excyclo 16.0 ± 5.5°',
  signs1986: 'Arch Ophthalmol 1986;104:1771-6 — bilateral SO palsy: V-pattern esotropia, reversing hypertropia',
  parks1958: 'Parks, Arch Ophthalmol 1958;60:1027-35 — the three-step test',
  donahue2001: 'Donahue et al., Am J Ophthalmol 2001;132:751-6 — IO palsy: hypotropic eye incyclo; skew: hypotropic eye excyclo',
  skew2005: 'Am Orthopt J 2005;55:45-7 — ocular tilt reaction: hypertropic eye incyclo',
  arnoldi2015: 'Arnoldi & Reynolds, Am Orthopt J 2015;65:81 — TED with IR restriction: 5.5 ± 3° unilateral, 21 ± 5° bilateral',
  wong2010: 'Wong, J AAPOS 2010;14:61-7 — upright–supine test: skew falls ≥50% lying down',
  arch1984: 'Arch Ophthalmol 1984;102:717-20 — no DMR cyclodeviation in some skew cases; tilt noticed by 55/86/100% at 5/10/15°',
  adaptation1979: 'Ophthalmology 1979;86:1451-61 — sensory adaptation: torted eye without subjective torsion',
  fixation1982: 'Am J Ophthalmol 1982 (clinical-facts R29) — subjective excyclo in the non-paretic eye when the paretic eye fixes',
  kang2020: 'Kang et al., PLoS One 2020 — paretic eye disc–fovea angle 12.19° vs 6.71° in the fellow eye',
  muscleActions: 'Muscle actions, clinical-facts §6.1/§6.3 (derived) — SR weakness: mild excyclo; IR weakness: mild incyclo',
  maddoxRod: 'Maddox rod testing presupposes simultaneous perception (clinical-facts §8, common practice)',
  modelChoice: 'Cyclodial model choice (no single published figure)',
} as const
