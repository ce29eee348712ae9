import { defineConfig } from 'drizzle-kit'

export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema.ts',
  out: './server/db/migrations',
  dbCredentials: { url: process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside' },
})
