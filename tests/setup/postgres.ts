import { rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { fileURLToPath } from 'node:url'
import type { TestProject } from 'vitest/node'
import { startCluster } from '../../server/db/cluster'
import { createDb } from '../../server/db/index'
import { migrateDb } from '../../server/db/migrate'

declare module 'vitest' {
  export interface ProvidedContext {
    /** URL of the template database (migrated, empty); tests copy it, never use it. */
    pgTemplateUrl: string
  }
}

export const TEMPLATE_DB = 'chopline_template'

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number }
      srv.close(() => resolve(port))
    })
  })
}

/** A throwaway cluster per run, on its own port and folder, so it never touches `npm start`'s. */
export default async function setup(project: TestProject) {
  const dataDir = fileURLToPath(
    new URL(`../../.tmp/pg-${project.name}-${process.pid}`, import.meta.url),
  )
  const cluster = await startCluster({
    dataDir,
    port: await freePort(),
    user: 'chopline_test',
    password: 'throwaway',
    database: TEMPLATE_DB,
    durable: false,
  })
  const db = createDb(cluster.url())
  await migrateDb(db)
  await db.$client.end()
  project.provide('pgTemplateUrl', cluster.url())
  return async () => {
    await cluster.stop()
    rmSync(cluster.dataDir, { recursive: true, force: true })
  }
}
