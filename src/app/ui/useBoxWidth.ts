import { useEffect, useState } from 'react'
import type { RefObject } from 'react'

/** The width (CSS pixels, at least `min`) of the element behind `ref`, kept up to date as it resizes. */
export function useBoxWidth(ref: RefObject<HTMLElement | null>, initial = 320, min = 200): number {
  const [width, setWidth] = useState(initial)
  useEffect(() => {
    const el = ref.current
    if (!el) return
    const ro = new ResizeObserver(() => setWidth(Math.max(min, Math.floor(el.clientWidth))))
    ro.observe(el)
    return () => ro.disconnect()
  }, [ref, min])
  return width
}
