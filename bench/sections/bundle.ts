/**
 * Client bundle: builds the client with the project's Vite config into a temporary folder (dist/ is left alone),
 * then measures what a first visit downloads — the entry script named in index.html, its modulepreloads and static
 * imports, and the stylesheets — and each lazy route chunk with the shared chunks only it pulls in, all gzip-compressed
 * (level 9). Module sizes per package show what fills the initial chunks, and the offenders are named: recharts in an
 * initial chunk, mathjs's expression parser anywhere (only `import { unit } from 'mathjs'` is allowed).
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, relative, resolve } from 'node:path'
import { gzipSync } from 'node:zlib'
import type { Plugin } from 'vite'
import { type Report, round } from '../lib/report.ts'

interface ChunkInfo {
  fileName: string
  isEntry: boolean
  isDynamicEntry: boolean
  facadeModuleId: string | null
  imports: string[]
  dynamicImports: string[]
  css: string[]
  modules: { id: string; renderedLength: number }[]
}

function recorder(chunks: Map<string, ChunkInfo>): Plugin {
  return {
    name: 'fillwright-bench-recorder',
    apply: 'build',
    generateBundle(_options, bundle) {
      for (const item of Object.values(bundle)) {
        if (item.type !== 'chunk') continue
        const meta = (item as unknown as { viteMetadata?: { importedCss?: Set<string> } }).viteMetadata
        chunks.set(item.fileName, {
          fileName: item.fileName,
          isEntry: item.isEntry,
          isDynamicEntry: item.isDynamicEntry,
          facadeModuleId: item.facadeModuleId ?? null,
          imports: [...item.imports],
          dynamicImports: [...item.dynamicImports],
          css: meta?.importedCss ? [...meta.importedCss] : [],
          modules: Object.entries(item.modules).map(([id, m]) => ({ id, renderedLength: m.renderedLength })),
        })
      }
    },
  }
}

/** "recharts", "@tanstack/react-query", "app: src/features/orders", "shared/physics", … */
export function ownerOf(moduleId: string, root: string): string {
  const id = moduleId.replace(/^\0/, '').split('?')[0]
  const nm = id.lastIndexOf('/node_modules/')
  if (nm >= 0) {
    const rest = id.slice(nm + '/node_modules/'.length).split('/')
    return rest[0].startsWith('@') ? `${rest[0]}/${rest[1]}` : rest[0]
  }
  if (!id.startsWith('/')) return '(bundler runtime)'
  const rel = relative(root, id)
  const parts = rel.split('/')
  if (parts[0] === 'src' && parts[1] === 'features') return `src/features/${parts[2]}`
  if (parts[0] === 'src' || parts[0] === 'shared') return `${parts[0]}/${parts[1]}`
  return rel
}

function gzipKb(buf: Buffer): number {
  return gzipSync(buf, { level: 9 }).length / 1024
}

/** The files index.html loads on a first visit: entry scripts, modulepreloads, stylesheets. */
export function htmlAssets(html: string): { scripts: string[]; preloads: string[]; styles: string[] } {
  const attr = (tag: string, name: string) => new RegExp(`${name}="([^"]+)"`).exec(tag)?.[1]
  const scripts = [...html.matchAll(/<script\b[^>]*type="module"[^>]*>/g)].map((m) => attr(m[0], 'src')).filter((s): s is string => Boolean(s))
  const links = [...html.matchAll(/<link\b[^>]*>/g)].map((m) => m[0])
  const preloads = links
    .filter((l) => /rel="modulepreload"/.test(l))
    .map((l) => attr(l, 'href'))
    .filter((s): s is string => Boolean(s))
  const styles = links
    .filter((l) => /rel="stylesheet"/.test(l))
    .map((l) => attr(l, 'href'))
    .filter((s): s is string => Boolean(s))
  return { scripts, preloads, styles }
}

/** `import { unit } from 'mathjs'` is the only mathjs import allowed in client-reachable code. */
export function mathjsImportOffenders(files: { path: string; text: string }[]): string[] {
  const out: string[] = []
  for (const f of files) {
    for (const m of f.text.matchAll(/import\s*(type\s+)?([^'";]*?)\s*from\s*['"]mathjs['"]|import\(\s*['"]mathjs['"]\s*\)/g)) {
      if (m[1]) continue
      const clause = (m[2] ?? '').replace(/\s+/g, ' ').trim()
      if (clause !== '{ unit }') out.push(`${f.path}: ${m[0].replace(/\s+/g, ' ')}`)
    }
  }
  return out
}

function sourceFiles(dir: string): { path: string; text: string }[] {
  const out: { path: string; text: string }[] = []
  const walk = (d: string) => {
    for (const name of readdirSync(d)) {
      if (name === 'node_modules' || name.startsWith('.')) continue
      const p = join(d, name)
      if (statSync(p).isDirectory()) walk(p)
      else if (/\.(ts|tsx)$/.test(name)) out.push({ path: p, text: readFileSync(p, 'utf8') })
    }
  }
  walk(dir)
  return out
}

export async function runBundle(report: Report, root: string): Promise<void> {
  const section = 'client bundle (KB gzip, level 9)'
  const { build } = await import('vite')
  const outDir = mkdtempSync(join(tmpdir(), 'fillwright-bench-dist-'))
  const chunks = new Map<string, ChunkInfo>()
  try {
    const t0 = performance.now()
    try {
      await build({
        root,
        logLevel: 'silent',
        build: { outDir, emptyOutDir: true, write: true, reportCompressedSize: false },
        plugins: [recorder(chunks)],
      })
    } catch (err) {
      report.note(
        `the client build failed, bundle figures not measured: ${String(err instanceof Error ? err.message : err)
          .split('\n')
          .filter((l) => l.trim())
          .slice(0, 3)
          .join(' ')
          .slice(0, 400)}`,
      )
      for (const key of ['client_build_s', 'initial_js_kb_gzip', 'initial_css_kb_gzip', 'initial_total_kb_gzip', 'bundle_offender_count'])
        report.add(section, key, null, 'not measured: the client build failed')
      return
    }
    report.add(section, 'client_build_s', round((performance.now() - t0) / 1000, 1), 'vite build of the client')

    const html = readFileSync(join(outDir, 'index.html'), 'utf8')
    const { scripts, preloads, styles } = htmlAssets(html)
    const file = (url: string) => url.replace(/^\//, '')
    const initial = new Set<string>()
    const visit = (name: string) => {
      if (initial.has(name)) return
      initial.add(name)
      for (const dep of chunks.get(name)?.imports ?? []) visit(dep)
    }
    for (const s of [...scripts, ...preloads]) visit(file(s))
    const css = new Set(styles.map(file))
    for (const name of initial) for (const c of chunks.get(name)?.css ?? []) css.add(c)
    const size = (name: string) => gzipKb(readFileSync(join(outDir, name)))
    const initialJs = [...initial].reduce((s, n) => s + size(n), 0)
    const initialCss = [...css].reduce((s, n) => s + size(n), 0)
    report.add(section, 'initial_js_kb_gzip', round(initialJs, 1), `entry script + static imports/modulepreloads (${initial.size} file(s))`)
    report.add(section, 'initial_css_kb_gzip', round(initialCss, 1), `stylesheets of the first visit (${css.size} file(s))`)
    report.add(section, 'initial_total_kb_gzip', round(initialJs + initialCss, 1), 'initial JS + CSS')

    // what fills the initial chunks (minified bytes per package, before compression)
    const byOwner = new Map<string, number>()
    for (const name of initial)
      for (const m of chunks.get(name)?.modules ?? []) byOwner.set(ownerOf(m.id, root), (byOwner.get(ownerOf(m.id, root)) ?? 0) + m.renderedLength)
    const top = [...byOwner.entries()].sort((a, b) => b[1] - a[1]).slice(0, 12)
    report.add(
      section,
      'initial_js_top_packages',
      top.map(([k, v]) => `${k} ${(v / 1024).toFixed(0)}K`).join(', '),
      'largest contributors to the initial JS, KB of rendered module code (before minification and gzip)',
    )
    report.add(
      section,
      'initial_mathjs_kb_rendered',
      round((byOwner.get('mathjs') ?? 0) / 1024, 1),
      'mathjs in the initial JS, KB rendered (before minification)',
    )
    report.add(
      section,
      'initial_recharts_kb_rendered',
      round((byOwner.get('recharts') ?? 0) / 1024, 1),
      'recharts in the initial JS, KB rendered (should be 0: lazy routes only)',
    )

    // offenders
    const offenders: string[] = []
    if ((byOwner.get('recharts') ?? 0) > 0) offenders.push('recharts is in the initial JS (import it only from lazy routes)')
    const parser = [...chunks.values()].flatMap((c) =>
      c.modules.filter((m) => /\/node_modules\/mathjs\/lib\/esm\/expression\//.test(m.id)).map(() => c.fileName),
    )
    if (parser.length) offenders.push(`mathjs's expression parser is bundled in ${[...new Set(parser)].join(', ')}`)
    const sources = [...sourceFiles(resolve(root, 'src')), ...sourceFiles(resolve(root, 'shared'))].map((f) => ({ ...f, path: relative(root, f.path) }))
    for (const o of mathjsImportOffenders(sources)) offenders.push(`mathjs import other than { unit }: ${o}`)
    report.add(section, 'bundle_offenders', offenders.length ? offenders.join('; ') : 'none', 'recharts in initial chunks, mathjs beyond { unit }')
    report.add(section, 'bundle_offender_count', offenders.length, 'number of offenders')
    // lazy route chunks: the chunk and the shared chunks it needs beyond the initial ones
    const routeSection = 'route chunks (lazy, KB gzip incl. chunks not already loaded)'
    const routes = [...chunks.values()].filter((c) => c.isDynamicEntry && c.facadeModuleId && /\.route\.tsx?$/.test(c.facadeModuleId))
    routes.sort((a, b) => (a.facadeModuleId ?? '').localeCompare(b.facadeModuleId ?? ''))
    for (const r of routes) {
      const need = new Set<string>()
      const walk = (name: string) => {
        if (initial.has(name) || need.has(name)) return
        need.add(name)
        for (const dep of chunks.get(name)?.imports ?? []) walk(dep)
      }
      walk(r.fileName)
      const cssNeed = new Set<string>()
      for (const n of need) for (const c of chunks.get(n)?.css ?? []) if (!css.has(c)) cssNeed.add(c)
      const kb = [...need, ...cssNeed].reduce((s, n) => s + size(n), 0)
      const rel = relative(root, r.facadeModuleId!)
      const m = /src\/features\/([^/]+)\/routes\/(.+)\.route\.tsx?$/.exec(rel)
      const key = `route_${(m ? `${m[1]}_${m[2]}` : rel).replace(/[^A-Za-z0-9]+/g, '_').toLowerCase()}_kb_gzip`
      const packages = new Set<string>()
      const owners = new Map<string, number>()
      for (const n of need)
        for (const mod of chunks.get(n)?.modules ?? []) {
          const owner = ownerOf(mod.id, root)
          if (mod.id.includes('/node_modules/')) packages.add(owner)
          owners.set(owner, (owners.get(owner) ?? 0) + mod.renderedLength)
        }
      const largest = [...owners.entries()]
        .sort((a, b) => b[1] - a[1])
        .slice(0, 3)
        .map(([k, v]) => `${k} ${(v / 1024).toFixed(0)}K`)
        .join(', ')
      const heavy = [...packages].filter((p) => ['recharts', 'mathjs', '@tanstack/react-table', 'react-hook-form', 'zod', 'bwip-js', 'papaparse'].includes(p))
      report.add(routeSection, key, round(kb, 1), `${rel}${heavy.length ? ` (pulls ${heavy.join(', ')})` : ''}; largest: ${largest}`)
    }
    report.add(routeSection, 'route_chunks', routes.length, 'lazy route chunks')
  } finally {
    rmSync(outDir, { recursive: true, force: true })
    report.budget({ key: 'initial_js', label: 'initial JS, KB gzip', figure: 'initial_js_kb_gzip', limit: 180, kind: 'max' })
    report.budget({
      key: 'bundle_offenders',
      label: 'bundle offenders (recharts initial, mathjs beyond { unit })',
      figure: 'bundle_offender_count',
      limit: 0,
      kind: 'max',
    })
  }
}
