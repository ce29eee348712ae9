// Where the running test server, its database and the mail catcher are (set by scripts/test.sh).
export const BASE_URL = process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3100'
export const MAIL_URL = process.env.WAYSIDE_MAIL_URL ?? 'http://127.0.0.1:2601'
export const DATABASE_URL = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside_test_0'
export const DEMO_PASSWORD = 'wayside-demo'
export const DEMO = {
  admin: 'admin@wayside.test',
  dispatcher: 'dispatch@wayside.test',
  office: 'office@wayside.test',
  mech1: 'mech1@wayside.test',
  mech2: 'mech2@wayside.test',
} as const
