import type { Mailbox } from '../mail/mailbox'
import { Router } from 'express'
import { z } from 'zod'
import { notFoundError } from '../http-error'

const MailIdParams = z.object({ id: z.string().regex(/^[\w-]{1,64}$/, 'is not a mail id') })

/**
 * Development only: the messages the local fake SMTP server caught (invitations, reset links).
 * Mounted only outside production while the app listens on loopback (servesDevMail in env.ts).
 */
export function devMailRoutes(mailbox: Mailbox): Router {
  const router = Router()
  router.get('/dev/mail', async (_req, res) => {
    const mails = await mailbox.list()
    res.json({ mails: mails.map(({ id, receivedAt, from, to, subject }) => ({ id, receivedAt, from, to, subject })) })
  })
  router.get('/dev/mail/:id', async (req, res) => {
    const { id } = MailIdParams.parse(req.params)
    const mail = await mailbox.get(id)
    if (!mail)
      throw notFoundError('message')
    res.json(mail)
  })
  return router
}
