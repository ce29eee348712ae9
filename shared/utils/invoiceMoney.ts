// Where an invoice stands with its money, in words people use. The stored status stays one of
// draft, sent, paid, void; "partly paid", "overpaid" and "credited" are read from the sums.
export type InvoiceMoneyInput = { status: 'draft' | 'sent' | 'paid' | 'void', totalCents: number, paidCents: number, creditedCents: number }
export type InvoiceMoneyState = 'draft' | 'unpaid' | 'partly_paid' | 'paid' | 'overpaid' | 'credited' | 'void'

export type InvoiceMoney = {
  /** The total less credit notes. */
  owedCents: number
  /** What is still to pay; below zero when more came in than is owed. */
  balanceCents: number
  state: InvoiceMoneyState
  word: string
}

const WORDS: Record<InvoiceMoneyState, string> = {
  draft: 'Draft',
  unpaid: 'Sent, not paid',
  partly_paid: 'Partly paid',
  paid: 'Paid',
  overpaid: 'Overpaid',
  credited: 'Credited in full',
  void: 'Void',
}

export function invoiceMoney(inv: InvoiceMoneyInput): InvoiceMoney {
  const owedCents = inv.totalCents - inv.creditedCents
  const balanceCents = owedCents - inv.paidCents
  let state: InvoiceMoneyState
  if (inv.status === 'void') state = 'void'
  else if (balanceCents < 0) state = 'overpaid'
  else if (balanceCents === 0 && inv.paidCents === 0 && inv.creditedCents > 0) state = 'credited'
  else if (balanceCents === 0) state = 'paid'
  else if (inv.paidCents > 0) state = 'partly_paid'
  else state = inv.status === 'draft' ? 'draft' : 'unpaid'
  return { owedCents, balanceCents, state, word: WORDS[state] }
}

/** Whether money can still be asked for on this invoice (the payment page, the office's forms). */
export function invoiceTakesPayment(inv: InvoiceMoneyInput): boolean {
  return inv.status !== 'void' && invoiceMoney(inv).balanceCents > 0
}
