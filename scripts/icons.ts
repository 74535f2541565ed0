// `npm run icons`: draws Lixivia's icon as SVG and renders the PNG sizes the manifest and iOS need.
// A copper drop on ink blue with a ray of light bending as it passes through: refraction.
import { writeFileSync } from 'node:fs'
import { Resvg } from '@resvg/resvg-js'

const ink = '#23395B'
const copper = '#C8743A'
const paper = '#FAF7F2'

/** The artwork on a 512 grid; `scale` shrinks it about the centre (maskable icons need margin). */
function artwork(scale: number): string {
  const t = `translate(256 256) scale(${scale}) translate(-256 -256)`
  return `<g transform="${t}">
    <path d="M256 78 C 226 130 138 226 138 306 A 118 118 0 0 0 374 306 C 374 226 286 130 256 78 Z" fill="${copper}"/>
    <path d="M170 318 a 88 88 0 0 0 58 64" fill="none" stroke="${paper}" stroke-opacity=".55" stroke-width="14" stroke-linecap="round"/>
    <polyline points="52,236 150,286 360,318 462,380" fill="none" stroke="${paper}" stroke-width="18" stroke-linecap="round" stroke-linejoin="round"/>
  </g>`
}

function rounded(body: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512"><rect width="512" height="512" rx="112" fill="${ink}"/>${body}</svg>`
}
function fullBleed(body: string): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512"><rect width="512" height="512" fill="${ink}"/>${body}</svg>`
}

function png(svg: string, size: number, file: string): void {
  const rendered = new Resvg(svg, { fitTo: { mode: 'width', value: size } }).render().asPng()
  writeFileSync(file, rendered)
  console.log(`${file}: ${size}×${size}, ${rendered.length} bytes`)
}

const icon = rounded(artwork(1))
writeFileSync('public/favicon.svg', `${icon}\n`)
png(icon, 192, 'public/icons/lixivia-192.png')
png(icon, 512, 'public/icons/lixivia-512.png')
// Maskable: the platform crops to its own shape, so the art stays inside the central 80 % circle.
png(fullBleed(artwork(0.72)), 512, 'public/icons/lixivia-maskable-512.png')
// iOS rounds the corners itself.
png(fullBleed(artwork(0.9)), 180, 'public/apple-touch-icon.png')
