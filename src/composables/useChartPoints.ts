import type { Ref } from 'vue'
import type { ChartPoint } from '../components/chart/frame'
import type { LocalRecord } from '../db/database'
import { shallowRef, watch } from 'vue'
import { pointLimit } from '../components/chart/bins'
import { eachBrewChunk, figuresOf } from '../db/ledgerQueries'

/**
 * The chart's points for these brews, kept as their two figures only: read a chunk at a time with
 * a label for the tooltip while they are few enough to be drawn one by one, and from the figures
 * index alone beyond that. Read again
 * when the brews kept change, a moment after the last change (a sync brings them in pages).
 */
export function useChartPoints(teamId: Ref<string | null>, ids: Ref<string[]>, idsRead: Ref<boolean>, labelOf: (brew: LocalRecord<'brew'>) => string) {
  const points = shallowRef<ChartPoint[]>([])
  const ready = shallowRef(false)
  let run = 0
  let timer: ReturnType<typeof setTimeout> | undefined
  async function read(list: string[]): Promise<void> {
    const mine = ++run
    let found: ChartPoint[] = []
    if (list.length > pointLimit && teamId.value) {
      // Too many to label: their figures come from the index alone.
      found = await figuresOf(teamId.value, list)
    }
    else {
      await eachBrewChunk(list, (brews) => {
        for (const brew of brews) {
          const tds = brew.derived?.tdsPercent
          const ey = brew.derived?.yieldPercent
          if (tds != null && ey != null)
            found.push({ id: brew.id, tdsPercent: tds, yieldPercent: ey, label: labelOf(brew) })
        }
      })
    }
    if (mine === run) {
      points.value = found
      ready.value = true
    }
  }
  // Nothing is read before the ids are (an empty list at first is not "no brews").
  watch([ids, idsRead], ([list, known]) => {
    clearTimeout(timer)
    if (!known)
      return
    if (!ready.value)
      return void read(list)
    timer = setTimeout(() => void read(list), 300)
  }, { immediate: true })
  return { points, ready }
}
