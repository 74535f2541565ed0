import { fileURLToPath } from 'node:url'
import { drizzle } from 'drizzle-orm/mysql2'
import { migrate } from 'drizzle-orm/mysql2/migrator'
import mysql from 'mysql2/promise'

export const migrationsFolder = fileURLToPath(new URL('./migrations', import.meta.url))

/** Applies the committed drizzle-kit migrations on one dedicated connection, then closes it. */
export async function runMigrations(url: string): Promise<void> {
  const connection = await mysql.createConnection({ uri: url, timezone: 'Z', multipleStatements: false })
  try {
    await migrate(drizzle(connection), { migrationsFolder })
  }
  finally {
    await connection.end()
  }
}
