/**
 * A customer as a mechanic sees them, in a call, a unit's history or the pull: who they are and
 * how to reach them, never billing terms, the billing e-mail or the office's notes; only whether
 * the driver signs the estimate before the work (shared/utils/estimateSigning.ts).
 */
type Customer = { id: string, name: string, kind: string, phone: string | null, version: number, updatedAt: Date, billingTerms: string }

export function mechanicCustomer(c: Customer) {
  const { id, name, kind, phone, version, updatedAt } = c
  return { id, name, kind, phone, version, updatedAt, signsEstimate: signsEstimate(c) }
}
