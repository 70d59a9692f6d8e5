import { spawnSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..')

function newest(entry: string): number {
  const full = path.join(root, entry)
  if (!existsSync(full)) return 0
  const stat = statSync(full)
  if (!stat.isDirectory()) return stat.mtimeMs
  return Math.max(stat.mtimeMs, ...readdirSync(full).map((name) => newest(path.join(entry, name))))
}

const built = path.join(root, 'dist', 'index.html')
const sources = Math.max(...['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'package.json'].map(newest))
if (!existsSync(built) || statSync(built).mtimeMs < sources) {
  console.log('Building the client…')
  const result = spawnSync('npx', ['vite', 'build'], { cwd: root, stdio: 'inherit' })
  if (result.status !== 0) process.exit(result.status ?? 1)
}
const { main } = await import('./index.ts')
await main()
