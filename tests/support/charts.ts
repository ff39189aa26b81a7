// Helpers for checking drawn charts in the browser tests.
import type { Locator, Page } from 'playwright-core'

/** Number of non-transparent pixels on a canvas: a drawn chart has many. */
export async function inkedPixels(canvas: Locator): Promise<number> {
  await canvas.waitFor({ state: 'visible' })
  return canvas.evaluate((c: HTMLCanvasElement) => {
    const ctx = c.getContext('2d')
    if (!ctx) return 0
    const { data } = ctx.getImageData(0, 0, c.width, c.height)
    let n = 0
    for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) n++
    return n
  })
}

/** Waits until the canvas inside `container` has at least `min` inked pixels (charts animate in). */
export async function waitForDrawnChart(page: Page, container: Locator, min = 2000, timeoutMs = 15_000): Promise<number> {
  const canvas = container.locator('canvas').first()
  const started = Date.now()
  let n = 0
  while (Date.now() - started < timeoutMs) {
    n = await inkedPixels(canvas)
    if (n >= min) return n
    await page.waitForTimeout(200)
  }
  return n
}

/** Hovers the middle of a chart's canvas (offset as fractions of its size) and returns the tooltip's text. */
export async function hoverReadout(page: Page, container: Locator, fx = 0.5, fy = 0.5): Promise<string> {
  const box = await container.locator('canvas').first().boundingBox()
  if (!box) return ''
  await page.mouse.move(box.x + box.width * fx, box.y + box.height * fy, { steps: 4 })
  await page.waitForTimeout(400)
  // ECharts draws its hover read-out as an HTML element inside the chart's container.
  return container.evaluate((el) => {
    const tips = [...el.querySelectorAll('div')].filter(d => getComputedStyle(d).position === 'absolute' && d.style.display !== 'none' && d.textContent && d.style.pointerEvents === 'none')
    return tips.map(d => d.textContent ?? '').join(' | ')
  })
}
