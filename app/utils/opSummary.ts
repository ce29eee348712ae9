// Plain words for an outbox op, for the sync panel and the call page.
import type { Op } from './fieldDb'

const CLOCK_WORDS: Record<string, string> = {
  travel_start: 'Started driving', arrive: 'Arrived', work_start: 'Work started', work_stop: 'Work stopped', depart: 'Left the scene',
}
const FIELD_WORDS: Record<string, string> = {
  status: 'status', outcome: 'outcome', storyComplaint: 'complaint', storyCause: 'cause', storyCorrection: 'correction',
  sceneChecklist: 'scene checklist', verification: 'verification', followUp: 'follow-up', clearedAt: 'cleared', steps: 'steps', conclusion: 'conclusion', finishedAt: 'finished',
}

/** A record field in words ('storyCause' → 'cause'). */
export const fieldWords = (field: string) => FIELD_WORDS[field] ?? field

const cut = (s: unknown, n = 40) => { const t = String(s ?? ''); return t.length > n ? `${t.slice(0, n - 1)}…` : t }

export function opSummary(op: Pick<Op, 'entity' | 'action' | 'changes'>): string {
  const c = op.changes
  if (op.action === 'update') {
    const what = Object.keys(c).map(k => FIELD_WORDS[k] ?? k).join(', ')
    return `${op.entity === 'call' ? 'Call' : op.entity === 'faultCode' ? 'Fault code' : 'Test run'} changed: ${what}`
  }
  switch (op.entity) {
    case 'reading': return `Reading: ${cut(c.label, 30)} ${c.value ?? ''} ${c.unit ?? ''}`.trim()
    case 'faultCode': return `Fault code ${c.code ?? `SPN ${c.spn} FMI ${c.fmi}`}`
    case 'note': return `Note: ${cut(c.text)}`
    case 'photo': return `Photo${c.caption ? `: ${cut(c.caption, 30)}` : ''}`
    case 'clockEvent': return CLOCK_WORDS[String(c.kind)] ?? 'Clock'
    case 'partLine': return `Part ${c.partNumber ?? ''} × ${c.quantity ?? ''}`
    case 'testRun': return 'Test card run'
    case 'signOff': return `Driver sign-off: ${cut(c.driverName, 30)}`
    case 'conflictResolution': return 'Conflict settled'
    default: return op.entity
  }
}
