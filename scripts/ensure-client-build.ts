import { execFileSync } from 'node:child_process'
import { existsSync, readdirSync, statSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

/** Builds the client with Vite when dist/ is missing or older than any client source. */
const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')
const built = join(root, 'dist', 'index.html')

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0
  const st = statSync(path)
  if (!st.isDirectory()) return st.mtimeMs
  let newest = 0
  for (const name of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, name)))
  return newest
}

const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'postcss.config.js', 'package-lock.json'].map((p) =>
  join(root, p),
)
const builtAt = existsSync(built) ? statSync(built).mtimeMs : 0
const sourceAt = Math.max(...sources.map(newestMtime))
if (builtAt < sourceAt) {
  console.log('Building the client (vite build)…')
  execFileSync(process.execPath, [join(root, 'node_modules', 'vite', 'bin', 'vite.js'), 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' })
} else {
  console.log('Client build is up to date.')
}
