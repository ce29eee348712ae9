// Money in words for people, apart from billing.ts (the invoice's computations and their time
// zones), so a screen that only shows an amount loads none of that.

/** "$1,234.56" for display; cents stay integers everywhere else. */
export function formatCents(cents: number, currency = 'USD'): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(cents / 100)
}
