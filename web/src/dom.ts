/**
 * Building elements from data. Text always goes in as text nodes, never as markup, so a sweep
 * label or a server message can never become HTML.
 */

export type Child = Node | string | number | null | undefined | false
type AttrValue = string | number | boolean | null | undefined
export type Attrs = Record<string, AttrValue | ((event: Event) => void)>

/** Properties set as properties (their attributes only hold the initial state). */
const PROPERTIES = new Set(['value', 'checked', 'selected', 'disabled', 'indeterminate'])

function apply (el: Element, attrs: Attrs | undefined): void {
  if (attrs === undefined) return
  for (const [key, value] of Object.entries(attrs)) {
    if (typeof value === 'function') {
      el.addEventListener(key.slice(2).toLowerCase(), value)
    } else if (PROPERTIES.has(key) && key in el) {
      (el as unknown as Record<string, unknown>)[key] = value
    } else if (value === true) {
      el.setAttribute(key, '')
    } else if (value !== false && value !== null && value !== undefined) {
      el.setAttribute(key, String(value))
    }
  }
}

function append (el: Element, children: ReadonlyArray<Child | readonly Child[]>): void {
  for (const child of children) {
    if (Array.isArray(child)) { append(el, child); continue }
    if (child === null || child === undefined || child === false) continue
    el.append(typeof child === 'object' ? child as Node : String(child))
  }
}

/** An HTML element: `h('button', { type: 'button', onclick: go }, 'Go')`. */
export function h<K extends keyof HTMLElementTagNameMap> (tag: K, attrs?: Attrs, ...children: Array<Child | readonly Child[]>): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag)
  apply(el, attrs)
  append(el, children)
  return el
}

const SVG_NS = 'http://www.w3.org/2000/svg'

/** An SVG element, attributes as given. */
export function s<K extends keyof SVGElementTagNameMap> (tag: K, attrs?: Attrs, ...children: Array<Child | readonly Child[]>): SVGElementTagNameMap[K] {
  const el = document.createElementNS(SVG_NS, tag)
  apply(el, attrs)
  append(el, children)
  return el
}

/** Replaces everything inside `el`. */
export function fill (el: Element, ...children: Array<Child | readonly Child[]>): void {
  el.replaceChildren()
  append(el, children)
}

let counter = 0
/** A page-unique id for label/for and aria-describedby pairs. */
export function uid (prefix: string): string {
  counter++
  return `${prefix}-${counter}`
}

/** Moves focus to a page's main heading after navigation, so screen readers announce the new page. */
export function focusHeading (root: Element): void {
  const heading = root.querySelector('h1')
  if (heading === null) return
  heading.setAttribute('tabindex', '-1')
  heading.focus({ preventScroll: true })
}
