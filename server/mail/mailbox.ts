import type { StoredMail } from '../../shared/schemas/mail'
import { mkdir, readdir, readFile, writeFile } from 'node:fs/promises'
import path from 'node:path'
import { setTimeout as sleep } from 'node:timers/promises'
import { StoredMailSchema } from '../../shared/schemas/mail'

/** The fake SMTP server's mail folder: one JSON file (and the raw .eml) per message. */
export class Mailbox {
  constructor(readonly dir: string) {}

  async save(mail: StoredMail, raw: Buffer): Promise<void> {
    await mkdir(this.dir, { recursive: true })
    await writeFile(path.join(this.dir, `${mail.id}.eml`), raw)
    await writeFile(path.join(this.dir, `${mail.id}.json`), `${JSON.stringify(mail, null, 2)}\n`)
  }

  /** Newest first. */
  async list(): Promise<StoredMail[]> {
    let names: string[]
    try {
      names = (await readdir(this.dir)).filter(name => name.endsWith('.json'))
    }
    catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT')
        return []
      throw error
    }
    const mails = await Promise.all(names.map(async name => StoredMailSchema.parse(JSON.parse(await readFile(path.join(this.dir, name), 'utf8')))))
    return mails.sort((a, b) => b.id.localeCompare(a.id))
  }

  async get(id: string): Promise<StoredMail | undefined> {
    return (await this.list()).find(mail => mail.id === id)
  }

  /** Waits for the newest message to one address (tests read e-mailed links this way). */
  async waitFor(to: string, timeoutMs = 10_000): Promise<StoredMail> {
    const deadline = Date.now() + timeoutMs
    while (Date.now() < deadline) {
      const found = (await this.list()).find(mail => mail.to.includes(to.toLowerCase()))
      if (found)
        return found
      await sleep(50)
    }
    throw new Error(`No mail to ${to} arrived within ${timeoutMs} ms`)
  }
}
