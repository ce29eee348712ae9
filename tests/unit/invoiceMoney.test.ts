import { describe, expect, it } from 'vitest'
import { invoiceMoney, invoiceTakesPayment } from '../../shared/utils/invoiceMoney'

// What an invoice's money is called, from its sums: a short payment is "partly paid", never paid.
describe('invoiceMoney', () => {
  type Input = Parameters<typeof invoiceMoney>[0]
  const inv = (o: Partial<Input>): Input => ({ status: 'sent', totalCents: 21750, paidCents: 0, creditedCents: 0, ...o })

  it('names each state and its balance', () => {
    expect(invoiceMoney(inv({ status: 'draft' }))).toMatchObject({ state: 'draft', balanceCents: 21750 })
    expect(invoiceMoney(inv({}))).toMatchObject({ state: 'unpaid', word: 'Sent, not paid', balanceCents: 21750 })
    // The $0.50 payment on a $217.50 invoice that once marked it paid.
    expect(invoiceMoney(inv({ paidCents: 50 }))).toMatchObject({ state: 'partly_paid', word: 'Partly paid', balanceCents: 21700 })
    expect(invoiceMoney(inv({ status: 'paid', paidCents: 21750 }))).toMatchObject({ state: 'paid', balanceCents: 0 })
    expect(invoiceMoney(inv({ status: 'paid', paidCents: 22750 }))).toMatchObject({ state: 'overpaid', balanceCents: -1000 })
    expect(invoiceMoney(inv({ status: 'paid', creditedCents: 21750 }))).toMatchObject({ state: 'credited', owedCents: 0 })
    expect(invoiceMoney(inv({ creditedCents: 2000, paidCents: 19750, status: 'paid' }))).toMatchObject({ state: 'paid', owedCents: 19750 })
    expect(invoiceMoney(inv({ status: 'void' })).state).toBe('void')
  })

  it('takes payment only while something is due on an invoice that is not void', () => {
    expect(invoiceTakesPayment(inv({ paidCents: 50 }))).toBe(true)
    expect(invoiceTakesPayment(inv({ paidCents: 21750 }))).toBe(false)
    expect(invoiceTakesPayment(inv({ status: 'void' }))).toBe(false)
  })
})
