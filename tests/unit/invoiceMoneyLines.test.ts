import { describe, expect, it } from 'vitest'
import { invoiceMoneyLines, type MoneyLinesInput } from '../../shared/utils/invoiceMoneyLines'

const day = (d: Date) => d.toISOString().slice(0, 10)
const base: MoneyLinesInput = { status: 'sent', totalCents: 21750, paidCents: 0, creditedCents: 0, payments: [], creditNotes: [] }
const payment = (o: Partial<MoneyLinesInput['payments'][number]>): MoneyLinesInput['payments'][number] => ({
  method: 'check', amountCents: 0, status: 'recorded', currency: 'usd', reference: null, receivedOn: null,
  createdAt: '2026-03-02T15:00:00Z', refunds: [], ...o,
})

// Worked by hand: a $217.50 invoice, a $20.00 credit note (labor billed twice), a $100.00 check, a
// $120.00 card payment of which $22.50 went back. Balance: 217.50 − 20.00 − 100.00 − 120.00 + 22.50 = $0.00.
describe('invoiceMoneyLines', () => {
  it('prints nothing when nothing was paid or credited', () => {
    expect(invoiceMoneyLines(base, day)).toEqual([])
  })

  it('lists credits, payments and refunds by date, each as it moves the balance, then the balance', () => {
    const lines = invoiceMoneyLines({
      ...base, status: 'paid', paidCents: 19750, creditedCents: 2000,
      creditNotes: [{ number: 4, reason: 'Labor billed twice', totalCents: -2000, createdAt: '2026-03-05T10:00:00Z' }],
      payments: [
        payment({ method: 'card', amountCents: 12000, status: 'succeeded', createdAt: '2026-03-06T09:00:00Z',
          refunds: [{ amountCents: 2250, reason: 'Paid over the balance', createdAt: '2026-03-07T09:00:00Z' }] }),
        payment({ amountCents: 10000, reference: 'CK 1001', receivedOn: '2026-03-02', createdAt: '2026-03-04T16:00:00Z' }),
      ],
    }, day)
    expect(lines).toEqual([
      { label: 'Paid by check CK 1001, 2026-03-02', amountCents: -10000 },
      { label: 'Credit note CN-4, 2026-03-05: Labor billed twice', amountCents: -2000 },
      { label: 'Paid by card, 2026-03-06', amountCents: -12000 },
      { label: 'Refunded, 2026-03-07: Paid over the balance', amountCents: 2250 },
      { label: 'Balance due', amountCents: 0, bold: true },
    ])
    // The amounts take the total to the balance, to the cent.
    expect(21750 + lines.slice(0, -1).reduce((s, l) => s + (l.amountCents ?? 0), 0)).toBe(lines.at(-1)!.amountCents)
  })

  it('shows a partial payment with what is still due, and money in another currency as not counted', () => {
    const lines = invoiceMoneyLines({
      ...base, paidCents: 5000,
      payments: [
        payment({ method: 'bank_transfer', amountCents: 5000, reference: 'ACH 88-213', status: 'recorded' }),
        payment({ method: 'card', amountCents: 21750, currency: 'eur', status: 'held', createdAt: '2026-03-03T09:00:00Z' }),
      ],
    }, day)
    expect(lines).toEqual([
      { label: 'Paid by bank transfer ACH 88-213, 2026-03-02', amountCents: -5000 },
      { label: 'Payment of 217.50 EUR, 2026-03-03: not counted, being refunded', amountCents: null },
      // 217.50 − 50.00 = 167.50
      { label: 'Balance due', amountCents: 16750, bold: true },
    ])
  })

  it('says a charge to the fleet\'s account in the fleet\'s words', () => {
    const lines = invoiceMoneyLines({ ...base, status: 'paid', paidCents: 21750,
      payments: [payment({ method: 'account', amountCents: 21750, status: 'posted', createdAt: '2026-03-04T16:00:00Z' })] }, day)
    expect(lines).toEqual([
      { label: 'Charged to your account, 2026-03-04', amountCents: -21750 },
      { label: 'Balance due', amountCents: 0, bold: true },
    ])
  })

  it('lists a check dated today, recorded this morning, before its refund the same morning', () => {
    // Recorded 08:14 UTC with today's date (placed at noon when only the date is known), refunded 08:15.
    const lines = invoiceMoneyLines({ ...base, paidCents: 9500, creditedCents: 1000,
      creditNotes: [{ number: 1, reason: 'Travel billed twice', totalCents: -1000, createdAt: '2026-12-02T08:14:30Z' }],
      payments: [payment({ amountCents: 10000, reference: 'CK 5521', receivedOn: '2026-12-02', createdAt: '2026-12-02T08:14:00Z',
        refunds: [{ amountCents: 500, reason: 'Cash back at the counter', createdAt: '2026-12-02T08:15:00Z' }] })] }, day)
    expect(lines.map(l => l.label)).toEqual([
      'Paid by check CK 5521, 2026-12-02',
      'Credit note CN-1, 2026-12-02: Travel billed twice',
      'Refunded, 2026-12-02: Cash back at the counter',
      'Balance due',
    ])
    // 217.50 − 100.00 − 10.00 + 5.00 = 112.50
    expect(lines.at(-1)!.amountCents).toBe(11250)
  })

  it('says when more came in than is owed', () => {
    const lines = invoiceMoneyLines({ ...base, status: 'paid', paidCents: 22750,
      payments: [payment({ method: 'cash', amountCents: 22750 })] }, day)
    expect(lines.at(-1)).toEqual({ label: 'Paid over what is owed: we refund the difference', amountCents: -1000, bold: true })
  })
})
