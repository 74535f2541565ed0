import net from 'node:net'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { assertPortFree, ensureDebianPackage, freePort, SetupError } from '../../scripts/lib/system'

afterEach(() => {
  vi.restoreAllMocks()
})

describe('ensureDebianPackage', () => {
  it('finds a program that is installed', () => {
    expect(ensureDebianPackage('sh', 'dash', 'A shell')).toMatch(/\/sh$/)
  })

  it('names the install command when the program is missing and we are not root', () => {
    vi.spyOn(process, 'getuid').mockReturnValue(1000)
    expect(() => ensureDebianPackage('lixivia-missing-program', 'lixivia-missing-pkg', 'The test'))
      .toThrow(new SetupError('The test needs Debian\'s lixivia-missing-pkg package: run `sudo apt-get install -y lixivia-missing-pkg` and try again.'))
  })
})

describe('assertPortFree', () => {
  it('passes for a free port and names the variable for a taken one', async () => {
    const port = await freePort()
    await expect(assertPortFree(port, 'PORT')).resolves.toBeUndefined()
    const holder = net.createServer()
    await new Promise<void>(resolve => holder.listen(port, '127.0.0.1', resolve))
    try {
      await expect(assertPortFree(port, 'SMTP_PORT')).rejects.toThrow(`Port ${port} on 127.0.0.1 is already in use (SMTP_PORT)`)
    }
    finally {
      holder.close()
    }
  })
})
