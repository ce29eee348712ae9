import { BASE_URL } from '../support/env'

// API tests run against the built server that scripts/test.sh starts; fail early and plainly
// when it is not there (run them through `npm test -- api`).
export default async function () {
  try {
    const res = await fetch(`${BASE_URL}/login`)
    if (!res.ok) throw new Error(`status ${res.status}`)
  }
  catch (err) {
    throw new Error(`No Wayside test server at ${BASE_URL} (${(err as Error).message}). Run the API tests with: npm test -- api`)
  }
}
