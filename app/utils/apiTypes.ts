// Answers of our own API as the browser receives them (JSON: dates become text), inferred from
// the server routes so the office screens and the routes cannot drift apart.
import type { InternalApi, Serialize, Simplify } from 'nitropack/types'

type Answer<Route extends keyof InternalApi, M extends keyof InternalApi[Route]> = Simplify<Serialize<Awaited<InternalApi[Route][M]>>>

/** The office's whole record (a mechanic's answer, `view: 'mechanic'`, leaves out the customer's billing fields). */
export type CallRecordView = Extract<Answer<'/api/calls/:id', 'get'>, { view: 'office' }>
export type SuggestionsView = Answer<'/api/calls/:id/suggestions', 'get'>
export type UnitView = Answer<'/api/units/:id', 'get'>
export type InvoiceView = Answer<'/api/invoices/:id', 'get'>
export type BillingDeskView = Answer<'/api/billing/desk', 'get'>
/** The fleet's status page (opened from a link, no account). */
export type FleetStatusView = Answer<'/api/share/:token', 'get'>
export type StatusLinkState = Answer<'/api/calls/:id/share', 'get'>
/** The fleet's approval page (opened from a link, no account). */
export type ApprovalLinkView = Answer<'/api/approve/:token', 'get'>
export type TruckListView = Answer<'/api/service-trucks', 'get'>
export type TruckStockView = Answer<'/api/service-trucks/:id/stock', 'get'>
export type StockMovesView = Answer<'/api/service-trucks/:id/moves', 'get'>
export type AgingView = Answer<'/api/billing/aging', 'get'>
