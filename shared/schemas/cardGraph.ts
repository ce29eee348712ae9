// The rules a card's graph must keep, beyond its shape. A card is a graph of steps whose ways
// (pass, fail, low, high, unjudged) lead to other steps or to conclusions. Besides every way
// leading somewhere and every step being reachable and able to finish, two rules keep a mechanic
// from throwing away good parts:
// - a conclusion that condemns a part ('sensor') is reached only through a failed verdict of a
//   step that checks that part (its own measurement failed on the path);
// - a conclusion that condemns the controller is reached only through every wire test of the
//   card ('wiring' steps), each of them passed.
import type { z } from 'zod'
import type { CardConclusion, CardStep, StepWay } from './testCards'

const WAYS: readonly StepWay[] = ['pass', 'fail', 'low', 'high', 'marginal', 'unjudged']
const FAILED: readonly StepWay[] = ['fail', 'low', 'high']
const WIRING = 'wiring'
const CONTROLLER = 'controller'

type Card = { steps: CardStep[], conclusions: CardConclusion[] }
type Edge = { from: string, way: StepWay, to: string }

// Every way a step declares, and each routed option as the pass or fail it is. A few of these may
// never be taken (the fail way of a question whose options are all routed); checking them too only
// makes the rules stricter.
export function stepEdges(s: CardStep): Edge[] {
  const ways = WAYS.flatMap(way => (s.next[way] === undefined ? [] : [{ from: s.id, way, to: s.next[way]! }]))
  const wayOf = (option: string): StepWay => ((s.passOptions ?? []).includes(option) ? 'pass' : 'fail')
  const routed = (s.routes ?? []).map(r => ({ from: s.id, way: wayOf(r.option), to: r.to }))
  return [...ways, ...routed]
}
const edgesOf = (card: Card): Edge[] => card.steps.flatMap(stepEdges)
const issue = (ctx: z.RefinementCtx, path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message })

interface PathOptions {
  /** Where to start (the first step when absent). */
  from?: string
  /** Which edges may be used (all when absent). */
  keep?: (e: Edge) => boolean
  /** Nodes the path may not pass. */
  skip?: ReadonlySet<string>
}

/** A path (node ids) to `goal` under the options; null when there is none. */
export function findPath(card: Card, goal: string, opts: PathOptions = {}): string[] | null {
  const start = opts.from ?? card.steps[0]?.id
  const skip = opts.skip ?? new Set<string>()
  const keep = opts.keep ?? (() => true)
  if (!start || skip.has(start)) return null
  const edges = edgesOf(card).filter(e => keep(e) && !skip.has(e.to))
  const parent = new Map<string, string | null>([[start, null]])
  const queue = [start]
  while (queue.length) {
    const at = queue.shift()!
    if (at === goal) {
      const path: string[] = []
      for (let n: string | null = at; n !== null; n = parent.get(n) ?? null) path.unshift(n)
      return path
    }
    for (const e of edges) {
      if (e.from !== at || parent.has(e.to)) continue
      parent.set(e.to, at)
      queue.push(e.to)
    }
  }
  return null
}

function pathText(card: Card, path: string[]): string {
  const name = (id: string) => card.steps.find(s => s.id === id)?.title ?? card.conclusions.find(c => c.id === id)?.text ?? id
  return path.map(name).join(' → ')
}

/** The two rules about condemning parts; each problem names the conclusion and a path that breaks the rule. */
export function condemnProblems(card: Card): { index: number, message: string }[] {
  const problems: { index: number, message: string }[] = []
  const stepOf = new Map(card.steps.map(s => [s.id, s]))
  const wiring = card.steps.filter(s => s.checks === WIRING)
  card.conclusions.forEach((c, index) => {
    if (!c.condemns) return
    if (c.condemns === CONTROLLER) {
      if (!wiring.length) {
        problems.push({ index, message: `"${c.text}" blames the controller, but the card has no wire tests (steps that check ${WIRING})` })
        return
      }
      // A wire test that did not pass must never lead on to the controller...
      for (const w of wiring) {
        for (const way of WAYS) {
          const to = w.next[way]
          if (way === 'pass' || to === undefined) continue
          if (findPath(card, c.id, { from: to })) {
            problems.push({ index, message: `"${c.text}" can be reached after "${w.title}" did not pass` })
            return
          }
        }
      }
      // ...and no path may reach it around any wire test.
      for (const w of wiring) {
        const around = findPath(card, c.id, { skip: new Set([w.id]) })
        if (around) {
          problems.push({ index, message: `"${c.text}" can be reached without the wire test "${w.title}": ${pathText(card, around)}` })
          return
        }
      }
      return
    }
    const part = c.condemns
    const unfailed = findPath(card, c.id, { keep: e => !(stepOf.get(e.from)?.checks === part && FAILED.includes(e.way)) })
    if (unfailed) {
      const message = `"${c.text}" condemns the ${part}, but a path reaches it with no failed step that checks the ${part}`
      problems.push({ index, message: `${message}: ${pathText(card, unfailed)}` })
    }
  })
  return problems
}

export function checkCardGraph(card: Card, ctx: z.RefinementCtx) {
  const stepIds = new Map<string, number>()
  card.steps.forEach((s, i) => {
    if (stepIds.has(s.id)) issue(ctx, ['steps', i, 'id'], `Step id "${s.id}" is used twice`)
    else stepIds.set(s.id, i)
  })
  const conclusionIds = new Set<string>()
  card.conclusions.forEach((c, i) => {
    const taken = conclusionIds.has(c.id) || stepIds.has(c.id)
    if (taken) issue(ctx, ['conclusions', i, 'id'], `Id "${c.id}" is already used by a step or conclusion`)
    conclusionIds.add(c.id)
  })
  let broken = false
  card.steps.forEach((s, i) => {
    for (const way of WAYS) {
      const to = s.next[way]
      if (to === undefined) continue
      if (!stepIds.has(to) && !conclusionIds.has(to)) {
        broken = true
        issue(ctx, ['steps', i, 'next', way], `"${to}" is neither a step nor a conclusion of this card`)
      }
      else if (to === s.id) {
        broken = true
        issue(ctx, ['steps', i, 'next', way], 'A step cannot lead to itself')
      }
    }
    s.routes?.forEach((r, j) => {
      if (!stepIds.has(r.to) && !conclusionIds.has(r.to)) {
        broken = true
        issue(ctx, ['steps', i, 'routes', j, 'to'], `"${r.to}" is neither a step nor a conclusion of this card`)
      }
      else if (r.to === s.id) {
        broken = true
        issue(ctx, ['steps', i, 'routes', j, 'to'], 'A step cannot lead to itself')
      }
    })
    if (s.compareWith !== undefined) {
      const j = stepIds.get(s.compareWith)
      if (j === undefined || j >= i) issue(ctx, ['steps', i, 'compareWith'], 'Compare with a step that comes before this one')
    }
  })
  if (broken || !card.steps.length) return

  const outs = (s: CardStep) => stepEdges(s).map(e => e.to)
  // Forward: what the first step can reach.
  const reached = new Set<string>([card.steps[0]!.id])
  const queue = [card.steps[0]!.id]
  while (queue.length) {
    const s = card.steps[stepIds.get(queue.shift()!)!]!
    for (const to of outs(s)) {
      if (!stepIds.has(to) || reached.has(to)) continue
      reached.add(to)
      queue.push(to)
    }
  }
  // Backward: which steps can still end at a conclusion.
  const ends = new Set<string>()
  for (let changed = true; changed;) {
    changed = false
    for (const s of card.steps) {
      if (ends.has(s.id) || !outs(s).some(to => conclusionIds.has(to) || ends.has(to))) continue
      ends.add(s.id)
      changed = true
    }
  }
  let loose = false
  card.steps.forEach((s, i) => {
    if (!reached.has(s.id)) issue(ctx, ['steps', i, 'id'], `No path from the first step leads to "${s.title}"`)
    else if (!ends.has(s.id)) issue(ctx, ['steps', i, 'next'], `From "${s.title}" no path reaches a conclusion (a loop with no way out)`)
    loose ||= !reached.has(s.id) || !ends.has(s.id)
  })
  if (loose) return
  for (const p of condemnProblems(card)) issue(ctx, ['conclusions', p.index, 'condemns'], p.message)
}
