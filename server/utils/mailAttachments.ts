// Attachments are made when the job sends, not when the mail is queued, so queueing stays quick
// and the queued row stays small. One registry: to attach a new kind of document, add its maker.
export type MailAttachmentRecipe = { make: keyof typeof MAIL_ATTACHMENT_MAKERS, id: string }
type Made = { filename: string, content: Buffer, contentType: string }

export const MAIL_ATTACHMENT_MAKERS = {
  'invoice-pdf': async (id: string): Promise<Made> => {
    const inv = await getInvoice(id)
    if (!inv) throw new Error(`Invoice ${id} is gone; nothing to attach`)
    return { filename: `invoice-W-${inv.number}.pdf`, content: await renderInvoicePdf(inv), contentType: 'application/pdf' }
  },
  'credit-note-pdf': async (id: string): Promise<Made> => {
    const note = await getCreditNote(id)
    if (!note) throw new Error(`Credit note ${id} is gone; nothing to attach`)
    return { filename: `credit-note-CN-${note.number}.pdf`, content: await renderCreditNotePdf(note), contentType: 'application/pdf' }
  },
  'service-report-pdf': async (id: string): Promise<Made> => {
    const facts = await serviceReportFacts(id)
    if (!facts) throw new Error(`Call ${id} is gone; nothing to attach`)
    return { filename: serviceReportFilename(facts), content: await renderServiceReportPdf(facts), contentType: 'application/pdf' }
  },
  'statement-pdf': async (customerId: string): Promise<Made> => {
    const statement = await customerStatement(customerId)
    if (!statement) throw new Error(`Customer ${customerId} is gone; nothing to attach`)
    return { filename: statementFilename(statement), content: await renderStatementPdf(statement), contentType: 'application/pdf' }
  },
} satisfies Record<string, (id: string) => Promise<Made>>

export function renderMailAttachment(recipe: MailAttachmentRecipe): Promise<Made> {
  const make = MAIL_ATTACHMENT_MAKERS[recipe.make]
  if (!make) throw new Error(`No maker for the attachment ${recipe.make}`)
  return make(recipe.id)
}
