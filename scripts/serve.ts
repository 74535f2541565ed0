// `npm run serve`: the production profile, with Caddy in front (see scripts/lib/serve-stack.ts).
import { runServeStack } from './lib/serve-stack'

await runServeStack()
