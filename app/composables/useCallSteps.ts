import type { CallOutcome } from '#shared/schemas/calls'
import type { CallView } from '~/stores/field'

// The status steps as actions: each writes the call change and its clock event in one transaction,
// so travel and labor come from the buttons, never from typed times. The Progress section and the
// next-step button both use these; whether the outcome question is open is shared by call, so the
// next-step button can open it where the Progress section shows it.
export function useCallSteps(view: () => CallView) {
  const field = useFieldStore()
  const marks = computed(() => view().clockEvents.map(e => ({ kind: String(e.kind), at: recordTime(e) })))
  const clock = computed(() => fieldClockTotals(marks.value))
  const working = computed(() => clock.value.working)
  const paused = computed(() => view().call.status === 'assigned' && clock.value.paused)
  // One active call per mechanic: starting to drive to (or work on) this call pauses the others running.
  const others = computed(() => view().runningElsewhere.map(c => c.number))
  const choosing = useState<boolean>(`call-outcome-open:${view().call.id}`, () => false)
  const busy = ref(false)
  const error = ref('')

  async function step(changes: Record<string, unknown>, kinds: string[], start = false) {
    busy.value = true
    error.value = ''
    const records = kinds.map(kind => ({ entity: 'clockEvent' as const, record: { kind } }))
    try {
      if (start) await field.startCall(view().call.id, changes, records)
      else await field.writeCall(view().call.id, changes, records)
    }
    catch (err) {
      error.value = err instanceof Error ? err.message : String(err)
    }
    finally {
      busy.value = false
    }
  }
  const enRoute = () => step({ status: 'en_route' }, ['travel_start'], true)
  const onSite = () => step({ status: 'on_site' }, ['arrive'])
  const toggleWork = () => step({}, [working.value ? 'work_stop' : 'work_start'], !working.value)
  async function complete(outcome: CallOutcome) {
    await step({ status: 'completed', outcome }, [...(working.value ? ['work_stop'] : []), 'depart'])
    choosing.value = false
  }
  return { working, paused, others, choosing, busy, error, enRoute, onSite, toggleWork, complete }
}
