import nodemailer, { type Transporter } from 'nodemailer'

let transport: Transporter | undefined

function useTransport(): Transporter {
  if (!transport) {
    const c = useRuntimeConfig()
    transport = nodemailer.createTransport({
      host: c.smtpHost, port: Number(c.smtpPort), secure: false,
      // The local catcher speaks plain SMTP; a real relay upgrades with STARTTLS when offered.
      ignoreTLS: c.smtpHost === '127.0.0.1' || c.smtpHost === 'localhost',
      auth: c.smtpUser ? { user: c.smtpUser, pass: c.smtpPass } : undefined,
    })
  }
  return transport
}

export type OutgoingMail = {
  to: string
  subject: string
  text: string
  html?: string
  attachments?: { filename: string, content: Buffer, contentType: string }[]
  kind: string
  relatedId?: string
}

/** Sends one message and logs it in mail_log, whether it went or failed. */
export async function sendMail(mail: OutgoingMail): Promise<{ messageId: string }> {
  const { mailFrom } = useRuntimeConfig()
  try {
    const info = await useTransport().sendMail({ from: mailFrom, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html, attachments: mail.attachments })
    await useDb().insert(tables.mailLog).values({ kind: mail.kind, toAddress: mail.to, subject: mail.subject, relatedId: mail.relatedId, messageId: info.messageId, status: 'sent' })
    return { messageId: info.messageId }
  }
  catch (err) {
    await useDb().insert(tables.mailLog).values({ kind: mail.kind, toAddress: mail.to, subject: mail.subject, relatedId: mail.relatedId, status: 'failed', error: (err as Error).message })
    throw createError({ status: 502, statusText: 'The mail server did not take the message; try again' })
  }
}
