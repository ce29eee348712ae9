// Words about a call and its unit that several screens, the e-mails and the PDFs print the same way.
import { DERATE_LABELS } from './callWords'

/** Brackets a person typed around a whole note, dropped so a label's own brackets are not doubled. */
function unwrapped(note: string): string {
  const t = note.trim()
  return /^\(.*\)$/.test(t) && !t.slice(1, -1).includes(')') ? t.slice(1, -1).trim() : t
}

/** "Derated (power or speed limited): 60 min to derate", or null when the engine runs normally. */
export function derateText(derate: string | null | undefined, note?: string | null): string | null {
  if (!derate || derate === 'none') return null
  const label = (DERATE_LABELS as Record<string, string>)[derate] ?? derate
  const n = note ? unwrapped(note) : ''
  return n ? `${label}: ${n}` : label
}

/**
 * "2019 Kestrel T8, DX13 · DX13 engine" without saying the engine twice: the engine is added only
 * when the year/make/model does not already name it.
 */
export function unitModelText(u: { yearMakeModel?: string | null, engine?: string | null }): string {
  const ymm = u.yearMakeModel?.trim() || ''
  const engine = u.engine?.trim() || ''
  const named = engine !== '' && ymm.toLowerCase().includes(engine.toLowerCase())
  return [ymm, engine && !named ? `${engine} engine` : ''].filter(Boolean).join(' · ')
}
