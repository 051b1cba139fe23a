/**
 * The figure typeface, Source Sans 3 (SIL Open Font License), from the `source-sans` npm
 * package: PNG and PDF renderings embed these files, so they look the same on every machine
 * whatever fonts it has installed, and the SVG layout measures text with their widths.
 */
import { createRequire } from 'node:module'
import { dirname, join } from 'node:path'

const root = dirname(createRequire(import.meta.url).resolve('source-sans/package.json'))

export const FIGURE_FONT_FAMILY = 'Source Sans 3'

export const FIGURE_FONT_FILES = {
  regular: join(root, 'TTF', 'SourceSans3-Regular.ttf'),
  semibold: join(root, 'TTF', 'SourceSans3-Semibold.ttf'),
  italic: join(root, 'TTF', 'SourceSans3-It.ttf')
} as const
