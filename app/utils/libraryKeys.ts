// Where the card library lives in the device's `library` store: written by the sync (syncApply),
// read by the library store. Runs in progress sit beside them under their own keys.
import type { TestCardView } from '#shared/schemas/testCards'

export const CARD_LIST_KEY = 'cards'
export const cardKey = (id: string, version: number) => `card:${id}@${version}`
export const runKey = (callId: string, cardId: string) => `run:${callId}:${cardId}`

/** The list of cards the phone offers, each at its current version, and when the sync stored it. */
export interface LibraryList {
  items: TestCardView[]
  fetchedAt: string
}
