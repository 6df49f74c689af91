// Starts the development mail catcher (an SMTP server inside the app that
// stores every message in the outbox table) and the retry loop for mail jobs.
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'
import type { AddressObject } from 'mailparser'

function addresses(value: AddressObject | AddressObject[] | undefined): string {
  if (!value) return ''
  return (Array.isArray(value) ? value : [value]).map(a => a.text).join(', ')
}

export default defineNitroPlugin((nitro) => {
  let server: SMTPServer | null = null

  if (mailCatcherEnabled()) {
    server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      logger: false,
      size: 2 * 1024 * 1024,
      onData(stream, _session, callback) {
        simpleParser(stream)
          .then(async (mail) => {
            const db = await useDb()
            await db.insertInto('outbox').values({
              message_id: mail.messageId ?? null,
              from_address: addresses(mail.from),
              to_address: addresses(mail.to),
              subject: mail.subject ?? '(no subject)',
              text_body: mail.text ?? '',
              html_body: typeof mail.html === 'string' ? mail.html : null,
              received_at: nowIso(),
            }).execute()
            callback()
          })
          .catch((error: Error) => callback(error))
      },
    })
    const port = Number(useRuntimeConfig().mailCatcherPort || 0) || 0
    server.listen(port, '127.0.0.1', () => {
      const address = server!.server.address()
      const actual = typeof address === 'object' && address ? address.port : port
      useCatcherPort(actual)
      console.info(`[mail] catcher listening on 127.0.0.1:${actual}; messages appear in the admin outbox`)
    })
    server.on('error', error => console.error(`[mail] catcher error: ${error.message}`))
  }

  const timer = setInterval(() => {
    deliverDueMail().catch(error => console.error(`[mail] retry loop: ${error instanceof Error ? error.message : error}`))
  }, Math.max(1, Math.min(30, Number(useRuntimeConfig().mailRetrySeconds) || 30)) * 1000)
  timer.unref()

  nitro.hooks.hook('close', () => {
    clearInterval(timer)
    server?.close()
  })
})
