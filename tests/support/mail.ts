import { MAIL_URL } from './env'

export type CaughtMessage = {
  id: number
  to: string[]
  from: string
  subject: string
  text: string
  attachments: { filename: string, contentType: string, size: number }[]
}

export async function caughtMail(): Promise<CaughtMessage[]> {
  return (await fetch(`${MAIL_URL}/messages`)).json() as Promise<CaughtMessage[]>
}
export async function clearMail() {
  await fetch(`${MAIL_URL}/messages`, { method: 'DELETE' })
}
/** Waits until a message to `to` arrives (mail is sent after the answer in some routes). */
export async function waitForMail(pred: (m: CaughtMessage) => boolean, ms = 5000) {
  const end = Date.now() + ms
  while (Date.now() < end) {
    const found = (await caughtMail()).filter(pred)
    if (found.length) return found
    await new Promise(r => setTimeout(r, 100))
  }
  return []
}
/** The catcher takes connections and then says nothing, like a hung mail server, until recovered. */
export async function stallMail() {
  await fetch(`${MAIL_URL}/stall`, { method: 'POST' })
}
export async function recoverMail() {
  await fetch(`${MAIL_URL}/recover`, { method: 'POST' })
}
