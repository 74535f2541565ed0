// `npm start`: build if needed, private MariaDB, migrations, demo data, mail fake, app and API.
import { runStack } from './lib/stack'

await runStack({ build: true })
