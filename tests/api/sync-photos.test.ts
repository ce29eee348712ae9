import { afterAll } from 'vitest'
import { closeTestPool } from '../support/db'
import { BASE_URL } from '../support/env'
import { photoByteTests } from '../support/photoTests'
import { cleanupSyncData } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

photoByteTests('the slot\'s server: a folder', () => BASE_URL)
