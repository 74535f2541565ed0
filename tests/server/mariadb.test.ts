import { spawn } from 'node:child_process'
import { once } from 'node:events'
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import net from 'node:net'
import os from 'node:os'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import mysql from 'mysql2/promise'
import { afterAll, describe, expect, it, vi } from 'vitest'
import { startMariaDb } from '../../scripts/lib/mariadb'
import { superviseMariaDb } from '../../scripts/lib/supervise'
import { freePort, processAlive, SetupError } from '../../scripts/lib/system'

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

const repoRoot = fileURLToPath(new URL('../..', import.meta.url))
const serverPid = (dir: string): number => Number.parseInt(readFileSync(path.join(dir, 'mariadbd.pid'), 'utf8'), 10)

describe('a MariaDB left running by a Lixivia that was killed', () => {
  it('is stopped, and a new one starts on the same data folder', async () => {
    // A Node process that starts MariaDB and is then killed -9, as by an out-of-memory killer.
    const owner = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', `
      import { startMariaDb } from './scripts/lib/mariadb.ts'
      await startMariaDb({ dataDir: process.argv[1], port: Number(process.argv[2]) })
      console.log('ready')
      setInterval(() => {}, 60_000)
    `, dataDir, String(await freePort())], { cwd: repoRoot, stdio: ['ignore', 'pipe', 'inherit'] })
    await vi.waitFor(() => expect(owner.stdout.read()?.toString()).toContain('ready'), { timeout: 30_000, interval: 100 })
    const orphan = serverPid(dataDir)
    owner.kill('SIGKILL')
    await once(owner, 'exit')
    expect(processAlive(orphan)).toBe(true)

    const server = await startMariaDb({ dataDir, port: await freePort() })
    try {
      expect(processAlive(orphan)).toBe(false)
      await server.asRoot(['SELECT 1'])
    }
    finally {
      await server.stop()
    }
  })

  it('is left alone while the Lixivia that started it still runs', async () => {
    const first = await startMariaDb({ dataDir, port: await freePort() })
    try {
      await expect(startMariaDb({ dataDir, port: await freePort() })).rejects.toThrow(/already running/)
      await first.asRoot(['SELECT 1'])
    }
    finally {
      await first.stop()
    }
  })
})

describe('superviseMariaDb', () => {
  it('starts MariaDB again after it is killed, and gives up after too many crashes', async () => {
    const lines: string[] = []
    let gaveUp = ''
    const supervised = await superviseMariaDb({ dataDir, port: await freePort() }, {
      log: line => lines.push(line),
      onGiveUp: (reason) => {
        gaveUp = reason
      },
    }, { maxRestarts: 1, windowMs: 60_000 })
    try {
      const first = supervised.current().pid
      process.kill(first, 'SIGKILL')
      await vi.waitFor(() => expect(supervised.current().pid).not.toBe(first), { timeout: 30_000, interval: 100 })
      await supervised.current().asRoot(['SELECT 1'])
      expect(lines.join('\n')).toMatch(/stopped unexpectedly \(SIGKILL\).*restarting/)

      process.kill(supervised.current().pid, 'SIGKILL')
      await vi.waitFor(() => expect(gaveUp).toMatch(/stopped unexpectedly/), { timeout: 10_000, interval: 100 })
    }
    finally {
      await supervised.stop()
    }
  })
})
