// `npx tsx scripts/demo-photos.ts`: draws the demo team's two photos once, on a canvas in Debian's
// Chromium, and writes them as JPEG to server/db/demo-photos/ (committed; the seed stores them
// through the file store). Both are drawings of invented things: a tray of green beans from an
// invented estate and an invented seller's offer sheet.
import { writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { chromium } from 'playwright-core'
import { ensureDebianPackage } from './lib/system'

const out = fileURLToPath(new URL('../server/db/demo-photos/', import.meta.url))
const browser = await chromium.launch({ executablePath: ensureDebianPackage('chromium', 'chromium', 'Drawing the demo photos'), args: ['--no-sandbox', '--disable-gpu'] })
const page = await browser.newPage()
// tsx names functions with a helper the page does not have; it is given one that does nothing.
await page.evaluate('window.__name = fn => fn')

const drawings = await page.evaluate(() => {
  // A small seeded generator, so the drawing is the same on every run.
  let seed = 7
  const random = (): number => {
    seed = (seed * 16807) % 2147483647
    return seed / 2147483647
  }
  const canvas = (width: number, height: number): [HTMLCanvasElement, CanvasRenderingContext2D] => {
    const c = document.createElement('canvas')
    c.width = width
    c.height = height
    return [c, c.getContext('2d')!]
  }

  const [green, g] = canvas(960, 720)
  g.fillStyle = '#3b3f45'
  g.fillRect(0, 0, 960, 720)
  g.fillStyle = '#d9d4c7'
  g.fillRect(60, 60, 840, 600)
  for (let i = 0; i < 420; i++) {
    const x = 90 + random() * 780
    const y = 90 + random() * 540
    const angle = random() * Math.PI
    const tone = 120 + Math.floor(random() * 40)
    g.save()
    g.translate(x, y)
    g.rotate(angle)
    g.fillStyle = `rgb(${tone - 20}, ${tone + 10}, ${tone - 35})`
    g.beginPath()
    g.ellipse(0, 0, 18, 12, 0, 0, Math.PI * 2)
    g.fill()
    g.strokeStyle = `rgb(${tone - 60}, ${tone - 40}, ${tone - 70})`
    g.lineWidth = 2
    g.beginPath()
    g.moveTo(-12, 0)
    g.bezierCurveTo(-4, 4, 4, -4, 12, 0)
    g.stroke()
    g.restore()
  }
  g.fillStyle = '#faf7f2'
  g.fillRect(600, 600, 300, 50)
  g.fillStyle = '#23395b'
  g.font = 'bold 22px sans-serif'
  g.fillText('AR-14 · 350 g sample', 616, 633)

  const [sheet, s] = canvas(720, 960)
  s.fillStyle = '#fdfcf8'
  s.fillRect(0, 0, 720, 960)
  s.fillStyle = '#1d1d1d'
  s.font = 'bold 30px serif'
  s.fillText('North Terraces Growers\' Exchange', 50, 80)
  s.font = '20px serif'
  s.fillText('Offer list, sample lots, main crop', 50, 115)
  const rows = [['Lot', 'Producer', 'Moisture', 'Price'], ['AR-14', 'Alder Ridge Estate', '10.8 %', 'EUR 7.40/kg'], ['CB-03', 'Copperbeck Farm', '11.4 %', 'EUR 8.10/kg'], ['HS-21', 'Hollin Step Cooperative', '10.5 %', 'EUR 6.20/kg'], ['MG-08', 'Marrowgate Station', '11.9 %', 'EUR 5.80/kg']]
  rows.forEach((row, i) => {
    const y = 200 + i * 60
    s.font = i === 0 ? 'bold 20px serif' : '20px serif'
    ;[50, 150, 430, 560].forEach((x, j) => s.fillText(row[j]!, x, y))
    s.strokeStyle = '#999'
    s.beginPath()
    s.moveTo(40, y + 20)
    s.lineTo(680, y + 20)
    s.stroke()
  })
  s.font = 'italic 18px serif'
  s.fillText('Prices FOT the dry mill, valid for 14 days.', 50, 560)
  s.strokeStyle = '#23395b'
  s.lineWidth = 3
  s.beginPath()
  s.moveTo(420, 820)
  s.bezierCurveTo(470, 760, 520, 860, 600, 800)
  s.stroke()
  return { green: green.toDataURL('image/jpeg', 0.8), sheet: sheet.toDataURL('image/jpeg', 0.8) }
})
await browser.close()

for (const [name, url] of [['alder-ridge-green.jpg', drawings.green], ['north-terraces-offer.jpg', drawings.sheet]] as const) {
  const bytes = Buffer.from(url.split(',')[1]!, 'base64')
  writeFileSync(`${out}${name}`, bytes)
  console.log(`${name}: ${bytes.length} bytes`)
}
