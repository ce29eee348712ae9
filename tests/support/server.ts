// A Wayside server process of a test's own (the built .output, the same environment that
// scripts/test.sh exported), for tests that kill a server mid-request or watch its memory.
import { spawn } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'

const ENTRY = fileURLToPath(new URL('../../.output/server/index.mjs', import.meta.url))

export type OwnServer = Awaited<ReturnType<typeof startOwnServer>>

export async function startOwnServer(port: number, env: Record<string, string> = {}) {
  const proc = spawn(process.execPath, [ENTRY], {
    env: { ...process.env, NITRO_HOST: '127.0.0.1', NITRO_PORT: String(port), ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let output = ''
  proc.stdout!.on('data', (b: Buffer) => {
    output += b.toString()
  })
  proc.stderr!.on('data', (b: Buffer) => {
    output += b.toString()
  })
  const exited = new Promise<void>(resolve => proc.once('exit', () => resolve()))
  const url = `http://127.0.0.1:${port}`

  const until = async (what: string, test: () => boolean | Promise<boolean>, ms: number) => {
    const end = Date.now() + ms
    while (Date.now() < end) {
      if (await test()) return
      if (proc.exitCode !== null) throw new Error(`server exited while waiting for ${what}:\n${output}`)
      await new Promise(r => setTimeout(r, 50))
    }
    throw new Error(`timed out waiting for ${what}:\n${output}`)
  }
  try {
    await until('the server to answer', async () => {
      try {
        return (await fetch(`${url}/login`)).ok
      }
      catch { return false }
    }, 60_000)
  }
  catch (err) {
    // A server that comes up after the test gave up must not linger and answer the next test.
    proc.kill('SIGKILL')
    throw err
  }

  return {
    url,
    pid: proc.pid!,
    output: () => output,
    waitForOutput: (text: string, ms = 20_000) => until(`"${text}"`, () => output.includes(text), ms),
    /** Resident memory of the process in KiB, now and at its peak, from /proc (Linux). */
    rssKb: () => Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${proc.pid}/status`, 'utf8'))?.[1]),
    peakRssKb: () => Number(/VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${proc.pid}/status`, 'utf8'))?.[1]),
    async kill(signal: NodeJS.Signals = 'SIGKILL') {
      if (proc.exitCode === null) proc.kill(signal)
      await exited
    },
  }
}

/** A port beside the slot's test server, free for a server of the test's own. */
export function ownServerPort(offset = 5) {
  return Number(process.env.WAYSIDE_TEST_PORT ?? 3100) + offset
}
