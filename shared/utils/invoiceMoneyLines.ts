// What has happened to an invoice's money since it was issued, as lines a customer reads under the
// totals (the PDF): credit notes and payments less what came back, in date order, then the balance.
// Each counted line's amount is what it does to the balance, so total + amounts = balance.
import { PAYMENT_METHOD_WORDS } from '../schemas/payments'
import { invoiceMoney, type InvoiceMoneyInput } from './invoiceMoney'

type When = Date | string
export type MoneyLinesInput = InvoiceMoneyInput & {
  payments: {
    method: keyof typeof PAYMENT_METHOD_WORDS
    amountCents: number
    status: string
    currency: string
    reference: string | null
    receivedOn: string | null
    createdAt: When
    refunds: { amountCents: number, reason: string, createdAt: When }[]
  }[]
  creditNotes: { number: number, reason: string, totalCents: number, createdAt: When }[]
}
export type MoneyLine = { label: string, amountCents: number | null, bold?: boolean }

/** The lines, or none when nothing was paid or credited; `day` writes a date as the document does. */
export function invoiceMoneyLines(inv: MoneyLinesInput, day: (d: Date) => string): MoneyLine[] {
  const dated: { at: number, line: MoneyLine }[] = []
  const add = (at: When | number, line: MoneyLine) => dated.push({ at: new Date(at).getTime(), line })
  for (const n of inv.creditNotes) {
    add(n.createdAt, { label: `Credit note CN-${n.number}, ${day(new Date(n.createdAt))}: ${n.reason}`, amountCents: n.totalCents })
  }
  for (const p of inv.payments) {
    const received = p.receivedOn ? new Date(`${p.receivedOn}T12:00:00Z`) : new Date(p.createdAt)
    // Placed by the earlier of when the money came and when it was recorded (a check dated today,
    // recorded this morning), and its refunds never before it.
    const placed = Math.min(received.getTime(), new Date(p.createdAt).getTime())
    const word = p.method === 'card' ? 'card' : PAYMENT_METHOD_WORDS[p.method].toLowerCase()
    if (p.status === 'held') {
      // Money in another currency does not count against the invoice; it goes back to the payer.
      const sum = `${(p.amountCents / 100).toFixed(2)} ${p.currency.toUpperCase()}`
      add(placed, { label: `Payment of ${sum}, ${day(received)}: not counted, being refunded`, amountCents: null })
      continue
    }
    const how = p.method === 'account' ? 'Charged to your account' : `Paid by ${word}${p.reference ? ` ${p.reference}` : ''}`
    add(placed, { label: `${how}, ${day(received)}`, amountCents: -p.amountCents })
    for (const r of p.refunds) {
      const at = Math.max(placed, new Date(r.createdAt).getTime())
      add(at, { label: `Refunded, ${day(new Date(r.createdAt))}: ${r.reason}`, amountCents: r.amountCents })
    }
  }
  if (!dated.length) return []
  const { balanceCents } = invoiceMoney(inv)
  const last: MoneyLine = balanceCents < 0
    ? { label: 'Paid over what is owed: we refund the difference', amountCents: balanceCents, bold: true }
    : { label: 'Balance due', amountCents: balanceCents, bold: true }
  return [...dated.sort((a, b) => a.at - b.at).map(d => d.line), last]
}
