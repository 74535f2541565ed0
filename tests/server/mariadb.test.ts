import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import net from 'node:net'
import os from 'node:os'
import path from 'node:path'
import mysql from 'mysql2/promise'
import { afterAll, describe, expect, it } from 'vitest'
import { startMariaDb } from '../../scripts/lib/mariadb'
import { freePort, SetupError } from '../../scripts/lib/system'

const dataDir = mkdtempSync(path.join(os.tmpdir(), 'lixivia-private-db-'))
afterAll(() => rmSync(dataDir, { recursive: true, force: true }))

describe('the private MariaDB that npm start runs', () => {
  it('keeps a row across a stop and a start on the same data folder', async () => {
    const port = await freePort()
    const first = await startMariaDb({ dataDir, port })
    const url = await first.provisionUser('lixivia', 'first-password-0123456789', 'lixivia')
    const writer = await mysql.createConnection({ uri: url })
    await writer.query('CREATE TABLE kept (id INT PRIMARY KEY, note VARCHAR(60))')
    await writer.query('INSERT INTO kept VALUES (1, ?)', ['cup 4, 1.31 %TDS'])
    await writer.end()
    await first.stop()

    const second = await startMariaDb({ dataDir, port })
    const reader = await mysql.createConnection({ uri: url })
    const [rows] = await reader.query('SELECT note FROM kept WHERE id = 1')
    await reader.end()
    await second.stop()
    expect(rows).toEqual([{ note: 'cup 4, 1.31 %TDS' }])
  })

  it('starts after a crash left a stale pid file behind', async () => {
    // A pid that cannot belong to a running MariaDB, as after a power cut.
    writeFileSync(path.join(dataDir, 'mariadbd.pid'), '999999999\n')
    const server = await startMariaDb({ dataDir, port: await freePort() })
    await server.stop()
  })

  it('says which variable to change when its port is taken', async () => {
    const blocker = net.createServer()
    const port = await freePort()
    await new Promise<void>(resolve => blocker.listen(port, '127.0.0.1', resolve))
    try {
      await expect(startMariaDb({ dataDir, port })).rejects.toThrow(SetupError)
      await expect(startMariaDb({ dataDir, port })).rejects.toThrow(/DB_PORT/)
    }
    finally {
      blocker.close()
    }
  })
})
