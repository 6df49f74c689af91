// Copies the open fonts Cyclodial ships from their @fontsource packages into
// public/fonts, so no font is ever fetched from a CDN. Run: npm run fonts
import { copyFileSync, mkdirSync, existsSync } from 'node:fs'
import { join } from 'node:path'

const out = 'public/fonts'
const files = [
  ['@fontsource/atkinson-hyperlegible', 'atkinson-hyperlegible-latin-400-normal.woff2'],
  ['@fontsource/atkinson-hyperlegible', 'atkinson-hyperlegible-latin-400-italic.woff2'],
  ['@fontsource/atkinson-hyperlegible', 'atkinson-hyperlegible-latin-700-normal.woff2'],
  ['@fontsource/atkinson-hyperlegible', 'atkinson-hyperlegible-latin-ext-400-normal.woff2'],
  ['@fontsource/atkinson-hyperlegible', 'atkinson-hyperlegible-latin-ext-700-normal.woff2'],
  ['@fontsource/jetbrains-mono', 'jetbrains-mono-latin-400-normal.woff2'],
  ['@fontsource/jetbrains-mono', 'jetbrains-mono-latin-700-normal.woff2'],
]

mkdirSync(out, { recursive: true })
for (const [pkg, file] of files) {
  const from = join('node_modules', pkg, 'files', file)
  if (!existsSync(from)) throw new Error(`missing ${from}: run npm ci first`)
  copyFileSync(from, join(out, file))
  console.log(`copied ${file}`)
}
