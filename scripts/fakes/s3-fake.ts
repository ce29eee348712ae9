// A local S3-compatible object store (s3rver, a test and development fake only) on loopback, with
// Wayside's photo bucket made at start. The app reaches it through unstorage's s3 driver exactly as
// it would a real bucket (signed requests, path-style URLs); its files live in a folder of its own.
import { mkdirSync } from 'node:fs'
import type { Server } from 'node:http'
import S3rver from 's3rver'

/** The fake's fixed credentials (s3rver's own defaults): never accepted by a production start. */
export const S3_FAKE_KEYS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' }

export async function startS3Fake(opts: { port: number, dir: string, bucket: string }) {
  mkdirSync(opts.dir, { recursive: true })
  const fake = new S3rver({
    address: '127.0.0.1', port: opts.port, directory: opts.dir, silent: true,
    configureBuckets: [{ name: opts.bucket }],
  })
  await fake.run()
  const http = (fake as unknown as { httpServer: Server }).httpServer
  return {
    endpoint: `http://127.0.0.1:${opts.port}`,
    bucket: opts.bucket,
    /** Stops answering at once: open keep-alive connections are cut, so a client sees the store gone. */
    async close() {
      http.closeAllConnections()
      await fake.close()
    },
  }
}

/** The app's variables for this fake (NUXT_UPLOADS_S3_*), for a server of a test's own or `npm start`. */
export function s3FakeEnv(port: number, bucket: string): Record<string, string> {
  return {
    NUXT_UPLOADS_S3_ENDPOINT: `http://127.0.0.1:${port}`,
    NUXT_UPLOADS_S3_BUCKET: bucket,
    NUXT_UPLOADS_S3_REGION: 'us-east-1',
    NUXT_UPLOADS_S3_ACCESS_KEY_ID: S3_FAKE_KEYS.accessKeyId,
    NUXT_UPLOADS_S3_SECRET_ACCESS_KEY: S3_FAKE_KEYS.secretAccessKey,
  }
}
