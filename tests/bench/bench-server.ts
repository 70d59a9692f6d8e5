// The server as a bench runs it: its own process, a fresh temporary data folder with the demo data, a free port.
import { spawn } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'

export interface BenchServer {
  url: string
  pid: number
  /** SIGTERM, wait for the exit, delete the data folder. */
  stop(): Promise<void>
}

/** Runs `node <args>` (e.g. `dist/server/index.js`) and resolves once it prints the address it listens on. */
export async function startBenchServer(args: string[], env: Record<string, string> = {}): Promise<BenchServer> {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'plumbline-bench-'))
  // Plain http on localhost: the refresh cookie must not ask for https.
  const serverEnv = { ...process.env, PORT: '0', DATA_DIR: dataDir, DEMO: 'true', LOG_LEVEL: 'warn', COOKIE_SECURE: 'false', ...env }
  const child = spawn(process.execPath, args, { env: serverEnv, stdio: ['ignore', 'pipe', 'inherit'] })
  const exited = new Promise((resolve) => child.once('exit', resolve))
  const url = await new Promise<string>((resolve, reject) => {
    child.stdout.on('data', (chunk: Buffer) => {
      const match = /running at (\S+)/.exec(chunk.toString())
      if (match) resolve(match[1]!)
    })
    child.once('exit', (code) => reject(new Error(`server exited with ${code}`)))
  })
  const stop = async () => {
    child.kill('SIGTERM')
    await exited
    rmSync(dataDir, { recursive: true, force: true })
  }
  return { url, pid: child.pid!, stop }
}
