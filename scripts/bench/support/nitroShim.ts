// Lets a benchmark call server code outside Nitro: what Nitro would auto-import (useDb, tables,
// useStorage, useRuntimeConfig, the helpers in server/utils and shared/utils) is put on globalThis,
// and modules load through tsx with the project's path aliases (#shared, ~~).
import { readdirSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { pathToFileURL } from 'node:url'
import { createError } from 'h3'
import { tsImport } from 'tsx/esm/api'
import { createStorage, prefixStorage } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'

const ROOT = process.cwd()
const TSCONFIG = resolve(ROOT, 'scripts/bench/support/tsconfig.json')

/** A module of the project, loaded as Nitro would see it. */
export function load<T = Record<string, unknown>>(path: string): Promise<T> {
  return tsImport(pathToFileURL(resolve(ROOT, path)).href, { parentURL: import.meta.url, tsconfig: TSCONFIG }) as Promise<T>
}

/**
 * Puts Nitro's auto-imports for these server/utils modules (and every shared/utils module) on
 * globalThis, and answers them all (call `usePool().end()` when done, so the process can exit).
 */
export async function installNitroShim(serverUtils: string[], config: Record<string, unknown>): Promise<Record<string, unknown>> {
  const storage = createStorage()
  storage.mount('assets:server', fsDriver({ base: join(ROOT, 'server/assets') }))
  storage.mount('uploads', fsDriver({ base: String(config.uploadsDir ?? join(ROOT, '.data/uploads')) }))
  Object.assign(globalThis, {
    useRuntimeConfig: () => config,
    useStorage: (base = '') => (base ? prefixStorage(storage, base) : storage),
    createError,
  })
  const shared = readdirSync(join(ROOT, 'shared/utils')).filter(f => f.endsWith('.ts')).map(f => `shared/utils/${f}`)
  for (const path of [...shared, ...serverUtils.map(u => `server/utils/${u}.ts`)]) {
    Object.assign(globalThis, await load(path))
  }
  return globalThis as unknown as Record<string, unknown>
}
