/**
 * Draws the app's icons (the installed app's and the home screen's) from one SVG of our own: two
 * waves on lake blue. Run once after changing the drawing: `npx tsx server/cli/icons.ts`; the
 * files it writes under src/public/icons/ are committed.
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import sharp from 'sharp'

const OUT = fileURLToPath(new URL('../../src/public/icons/', import.meta.url))

/** The drawing on a 512 grid; `inset` keeps the waves inside a maskable icon's safe circle. */
function drawing(inset: number, rounded: boolean): string {
  const s = 512
  const k = (s - 2 * inset) / 32
  const wave = (y: number) =>
    `M${inset + 4 * k} ${inset + y * k}` +
    ` c${3 * k} ${-3 * k} ${5 * k} ${-3 * k} ${8 * k} 0` +
    ` s${5 * k} ${3 * k} ${8 * k} 0` +
    ` ${5 * k} ${-3 * k} ${8 * k} 0`
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${s} ${s}">
  <rect width="${s}" height="${s}" rx="${rounded ? 96 : 0}" fill="#1f5f7a"/>
  <path d="${wave(12.5)}" stroke="#cfe8ef" stroke-width="${2.5 * k}" fill="none" stroke-linecap="round"/>
  <path d="${wave(18.5)}" stroke="#cfe8ef" stroke-width="${2.5 * k}" fill="none" stroke-linecap="round"/>
  <path d="${wave(24.5)}" stroke="#7fb8c9" stroke-width="${2 * k}" fill="none" stroke-linecap="round"/>
</svg>
`
}

mkdirSync(OUT, { recursive: true })
const plain = drawing(0, true)
const maskable = drawing(80, false)
writeFileSync(join(OUT, 'icon.svg'), plain)
for (const size of [192, 512])
  await sharp(Buffer.from(plain))
    .resize(size, size)
    .png()
    .toFile(join(OUT, `icon-${size}.png`))
await sharp(Buffer.from(maskable)).resize(512, 512).png().toFile(join(OUT, 'maskable-512.png'))
await sharp(Buffer.from(plain))
  .resize(180, 180)
  .flatten({ background: '#1f5f7a' })
  .png()
  .toFile(join(OUT, 'apple-touch-180.png'))
console.log(`icons written to ${OUT}`)
