// The bench's state: dials, prisms, gaze, fixation distance, room lights, the
// record and, in patient-turns mode, where the patient left the rods. Components
// read and change it; the page (or the quiz) owns the network.
//
// Each mounted <SimBench> makes its own with `createBench()` and provides it under
// BENCH_KEY; its parts take it with `useBench()`. A quiz can show several items
// without their dials sharing state.

import type { InjectionKey } from 'vue'
import type { InterpretationBody } from '#shared/engine/schemas'
import type { PatientTurnsResult, Presentation } from '#shared/engine/presentation'
import { parseRecord, readAsLine } from '#shared/engine/parser'
import { describeView } from '#shared/engine/words'
import { viewFromPresentation } from '#shared/engine/view'
import type { BenchSetting } from '#shared/engine/view'
import type { Distance, Eye, Gaze, Lights, Mode, PerEye, Prism } from '#shared/engine/types'
import { ZERO_TORSION_READING } from '#shared/engine/dial'
import type { AttemptBody, BenchDraft, TurnRequest } from '#shared/bench/contract'
import { roundReading } from '~/utils/sim/frame-geometry'
import { drawnFromReport, drawnFromView } from '~/utils/sim/view-geometry'
import type { DrawnView } from '~/utils/sim/view-geometry'

/** The trial frame holds at most four loose prisms (the attempt schema says so too). */
export const MAX_PRISMS = 4

export interface BenchInit {
  presentation: Presentation
  mode: Mode
  readScale: boolean
  draft?: BenchDraft | null
  turns?: PatientTurnsResult[]
}

const sameTurnSetting = (t: Pick<PatientTurnsResult, 'gaze' | 'distance'>, gaze: Gaze, distance: Distance) =>
  t.gaze === gaze && t.distance === distance

function benchSetup() {
  const presentation = shallowRef<Presentation | null>(null)
  const mode = ref<Mode>('learner-turns')
  const readScale = ref(false)
  /** A submitted or replayed attempt: nothing on the bench can change. */
  const locked = ref(false)

  const gaze = ref<Gaze>('primary')
  const distance = ref<Distance>('near')
  /** Where each rod sits: set by the learner (learner-turns) or the patient (patient-turns). */
  const rods = reactive<PerEye<number>>({ RE: ZERO_TORSION_READING, LE: ZERO_TORSION_READING })
  /** Patient-turns: what the learner reads off each scale (null until typed). */
  const typed = reactive<PerEye<number | null>>({ RE: null, LE: null })
  const prisms = ref<Prism[]>([])
  const lights = ref<Lights>('dim')
  const record = ref('')
  const interpretation = ref<InterpretationBody>({})

  const turns = ref<PatientTurnsResult[]>([])
  /** Patient-turns: the trial whose rods are on the frame, or null once the setting changed. */
  const activeTrial = ref<number | null>(null)

  const isPatientTurns = computed(() => mode.value === 'patient-turns')
  /** The numeric readout is hidden when the learner must read the engraved scale. */
  const readoutHidden = computed(() => readScale.value || isPatientTurns.value)
  const canTurnDials = computed(() => !isPatientTurns.value && !locked.value)

  const setting = computed<BenchSetting>(() => ({
    gaze: gaze.value,
    distance: distance.value,
    readings: { RE: rods.RE, LE: rods.LE },
    prisms: prisms.value,
    lights: lights.value,
  }))

  const activeTurn = computed<PatientTurnsResult | null>(() =>
    activeTrial.value === null ? null : (turns.value.find(t => t.trial === activeTrial.value) ?? null),
  )

  /** Learner-turns: the live optics. Patient-turns: the view the patient reported. */
  const liveView = computed(() =>
    presentation.value && !isPatientTurns.value ? viewFromPresentation(presentation.value, setting.value) : null,
  )
  const drawnView = computed<DrawnView | null>(() => {
    if (!presentation.value) return null
    if (liveView.value) return drawnFromView(liveView.value)
    return activeTurn.value ? drawnFromReport(presentation.value, activeTurn.value, prisms.value, lights.value) : null
  })
  const words = computed<string>(() => {
    if (liveView.value) return describeView(liveView.value).text
    return activeTurn.value?.words.text ?? ''
  })

  const parsed = computed(() => parseRecord(record.value))
  const readAs = computed(() => readAsLine(parsed.value))

  /** The readings that go into the attempt: the dials, or what the learner read off them. */
  const submittedReadings = computed<PerEye<number> | null>(() => {
    if (!isPatientTurns.value) return { RE: rods.RE, LE: rods.LE }
    return typed.RE === null || typed.LE === null ? null : { RE: typed.RE, LE: typed.LE }
  })

  const draft = computed<BenchDraft>(() => {
    const d: BenchDraft = {
      gaze: gaze.value,
      distance: distance.value,
      readings: isPatientTurns.value
        ? { RE: typed.RE ?? ZERO_TORSION_READING, LE: typed.LE ?? ZERO_TORSION_READING }
        : { RE: rods.RE, LE: rods.LE },
      prisms: prisms.value.map(p => ({ ...p })),
      lights: lights.value,
      record: record.value,
    }
    if (Object.values(interpretation.value).some(v => v !== undefined)) d.interpretation = { ...interpretation.value }
    return d
  })

  /** Why the record cannot be submitted yet, or null when it can. */
  const submitBlocker = computed<string | null>(() => {
    if (!presentation.value) return 'The case has not loaded.'
    if (isPatientTurns.value && !activeTurn.value) return 'Ask the patient to set the rods first.'
    if (!submittedReadings.value) return 'Enter your reading of both scales.'
    if (!record.value.trim()) return 'Write your record first.'
    return null
  })

  const attemptBody = computed<AttemptBody | null>(() => {
    if (submitBlocker.value || !submittedReadings.value) return null
    const body: AttemptBody = { ...draft.value, readings: submittedReadings.value }
    if (isPatientTurns.value && activeTurn.value) body.trial = activeTurn.value.trial
    return body
  })

  const turnRequest = computed<TurnRequest>(() => ({
    gaze: gaze.value,
    distance: distance.value,
    prisms: prisms.value.map(p => ({ ...p })),
    lights: lights.value,
  }))

  // ---- changes ------------------------------------------------------------

  /** In patient-turns a new setting means the patient has not judged it: rods back to 90°. */
  function settingChanged() {
    if (!isPatientTurns.value) return
    activeTrial.value = null
    rods.RE = ZERO_TORSION_READING
    rods.LE = ZERO_TORSION_READING
  }

  function setRod(eye: Eye, reading: number) {
    if (!canTurnDials.value) return
    rods[eye] = roundReading(reading)
  }
  const nudgeRod = (eye: Eye, delta: number) => setRod(eye, rods[eye] + delta)
  const resetRod = (eye: Eye) => setRod(eye, ZERO_TORSION_READING)

  function setTyped(eye: Eye, value: number | null) {
    if (locked.value) return
    typed[eye] = value === null || !Number.isFinite(value) ? null : value
  }

  function setGaze(g: Gaze) {
    if (locked.value) return
    if (g === gaze.value) return
    gaze.value = g
    settingChanged()
  }
  function setDistance(d: Distance) {
    if (locked.value) return
    if (d === distance.value) return
    distance.value = d
    settingChanged()
  }
  function setLights(l: Lights) {
    if (locked.value) return
    if (l === lights.value) return
    lights.value = l
    settingChanged()
  }
  function addPrism(p: Prism): boolean {
    if (locked.value) return false
    if (prisms.value.length >= MAX_PRISMS) return false
    prisms.value = [...prisms.value, { ...p }]
    settingChanged()
    return true
  }
  function removePrism(index: number) {
    if (locked.value) return
    prisms.value = prisms.value.filter((_, i) => i !== index)
    settingChanged()
  }
  function setRecord(text: string) {
    if (locked.value) return
    record.value = text
  }
  function setInterpretation(patch: Partial<InterpretationBody>) {
    if (locked.value) return
    interpretation.value = { ...interpretation.value, ...patch }
  }

  /** The patient has turned the rods: show where they left them. */
  function applyTurn(result: PatientTurnsResult) {
    turns.value = [...turns.value.filter(t => t.trial !== result.trial), result]
    gaze.value = result.gaze
    distance.value = result.distance
    rods.RE = result.readings.RE
    rods.LE = result.readings.LE
    activeTrial.value = result.trial
  }

  function load(init: BenchInit) {
    presentation.value = init.presentation
    mode.value = init.mode
    readScale.value = init.readScale
    turns.value = [...(init.turns ?? [])]
    const d = init.draft
    gaze.value = d?.gaze ?? 'primary'
    distance.value = d?.distance ?? 'near'
    prisms.value = d?.prisms.map(p => ({ ...p })) ?? []
    lights.value = d?.lights ?? 'dim'
    record.value = d?.record ?? ''
    interpretation.value = { ...(d?.interpretation ?? {}) }
    activeTrial.value = null
    rods.RE = ZERO_TORSION_READING
    rods.LE = ZERO_TORSION_READING
    typed.RE = null
    typed.LE = null
    if (init.mode === 'patient-turns') {
      if (d) {
        typed.RE = d.readings.RE
        typed.LE = d.readings.LE
      }
      // the latest turn for the saved setting is the one the learner was reading
      const last = [...turns.value].reverse().find(t => sameTurnSetting(t, gaze.value, distance.value))
      if (last) {
        rods.RE = last.readings.RE
        rods.LE = last.readings.LE
        activeTrial.value = last.trial
      }
    }
    else if (d) {
      rods.RE = roundReading(d.readings.RE)
      rods.LE = roundReading(d.readings.LE)
    }
  }

  return {
    presentation, mode, readScale, locked, gaze, distance, rods, typed, prisms, lights, record, interpretation,
    turns, activeTrial,
    isPatientTurns, readoutHidden, canTurnDials, setting, activeTurn, liveView, drawnView, words, parsed, readAs,
    submittedReadings, draft, submitBlocker, attemptBody, turnRequest,
    setRod, nudgeRod, resetRod, setTyped, setGaze, setDistance, setLights, addPrism, removePrism, setRecord,
    setInterpretation, applyTurn, load,
  }
}

/** A bench's state and the changes it allows; `useBench()` finds it inside <SimBench>. */
export function createBench() {
  return reactive(benchSetup())
}

export type Bench = ReturnType<typeof createBench>

/** How a bench's children find their state (provided by SimBench). */
export const BENCH_KEY: InjectionKey<Bench> = Symbol('cyclodial-bench')

export function useBench(): Bench {
  const bench = inject(BENCH_KEY, null)
  if (!bench) throw new Error('useBench() must be called inside <SimBench> (or a test that provides BENCH_KEY).')
  return bench
}
