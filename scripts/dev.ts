// `npm run dev`: the API stack (no client build) plus Vite's dev server, which proxies /api to it.
import { spawn } from 'node:child_process'
import { viteBin } from './lib/build'
import { repoRoot, runStack } from './lib/stack'

await runStack({ build: false })
const child = spawn(process.execPath, [viteBin(repoRoot)], { cwd: repoRoot, stdio: 'inherit' })
child.once('exit', code => process.kill(process.pid, code === 0 ? 'SIGTERM' : 'SIGINT'))
