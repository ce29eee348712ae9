import nodemailer, { type Transporter } from 'nodemailer'
import type Mail from 'nodemailer/lib/mailer'

export type OutgoingMail = {
  to: string
  subject: string
  text: string
  html?: string
  attachments?: Mail.Attachment[]
  /** What the message is about, for mail_log: 'call_assigned', 'invoice', … */
  kind: string
  relatedId?: string | null
}

let transport: Transporter | undefined

function useTransport(): Transporter {
  if (!transport) {
    const c = useRuntimeConfig()
    const port = Number(c.smtpPort)
    const loopback = ['127.0.0.1', 'localhost', '::1'].includes(String(c.smtpHost))
    transport = nodemailer.createTransport({
      host: String(c.smtpHost),
      port,
      secure: port === 465,
      // The local catcher speaks plain SMTP; a real provider gets STARTTLS as usual.
      ignoreTLS: loopback,
      auth: c.smtpUser ? { user: String(c.smtpUser), pass: String(c.smtpPass) } : undefined,
    })
  }
  return transport
}

/**
 * Sends one message and records it in mail_log, sent or failed. Throws when sending fails,
 * after logging, so the caller decides whether that undoes anything.
 */
export async function sendMail(mail: OutgoingMail): Promise<{ messageId: string }> {
  const from = String(useRuntimeConfig().mailFrom)
  const log = { kind: mail.kind, toAddress: mail.to, subject: mail.subject, relatedId: mail.relatedId ?? null }
  try {
    const info = await useTransport().sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html, attachments: mail.attachments })
    await useDb().insert(tables.mailLog).values({ ...log, messageId: info.messageId, status: 'sent' })
    return { messageId: info.messageId }
  }
  catch (err) {
    await useDb().insert(tables.mailLog).values({ ...log, status: 'failed', error: (err as Error).message?.slice(0, 500) ?? 'unknown' })
      .catch(logErr => console.error('[mail] could not log a failed message', logErr))
    throw err
  }
}
