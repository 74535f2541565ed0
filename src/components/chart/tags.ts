import type { Chart, Plugin } from 'chart.js'

/** A short text drawn beside a point of the chart (a cup's blind code), where it overlaps no other. */
export interface PointTag { index: number, text: string }

interface Box { x: number, y: number, w: number, h: number }
const overlaps = (a: Box, b: Box): boolean => a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h

/**
 * Draws each tag beside its point in the given dataset: to the right, else to the left, above or
 * below, whichever first clears the tags already drawn and stays on the plot.
 */
export function pointTags(options: { dataset: () => number, tags: () => PointTag[], dark: () => boolean }): Plugin<'scatter'> {
  return {
    id: 'lixivia-point-tags',
    afterDatasetsDraw(chart: Chart<'scatter'>) {
      const tags = options.tags()
      if (!tags.length)
        return
      const { ctx, chartArea } = chart
      const elements = chart.getDatasetMeta(options.dataset()).data
      ctx.save()
      ctx.font = '800 13px Nunito, system-ui, sans-serif'
      ctx.textBaseline = 'middle'
      const placed: Box[] = []
      for (const tag of tags) {
        const point = elements[tag.index]
        if (!point)
          continue
        const w = ctx.measureText(tag.text).width + 6
        const h = 16
        const gap = 10
        const tries: Box[] = [
          { x: point.x + gap, y: point.y - h / 2, w, h },
          { x: point.x - gap - w, y: point.y - h / 2, w, h },
          { x: point.x - w / 2, y: point.y - gap - h, w, h },
          { x: point.x - w / 2, y: point.y + gap, w, h },
        ]
        const inside = (box: Box) => box.x >= chartArea.left && box.x + box.w <= chartArea.right && box.y >= chartArea.top && box.y + box.h <= chartArea.bottom
        const box = tries.find(b => inside(b) && !placed.some(p => overlaps(p, b))) ?? tries.find(inside) ?? tries[0]!
        placed.push(box)
        // A paper-coloured plate under the text keeps it readable over grid lines and the zone band.
        ctx.fillStyle = options.dark() ? 'rgba(18, 24, 36, 0.85)' : 'rgba(250, 247, 242, 0.9)'
        ctx.fillRect(box.x, box.y, box.w, box.h)
        ctx.fillStyle = options.dark() ? '#f3eee6' : '#1b2333'
        ctx.fillText(tag.text, box.x + 3, box.y + h / 2)
      }
      ctx.restore()
    },
  }
}
