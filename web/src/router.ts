/**
 * Pages live in the URL fragment (#/sweeps/<id>, #/new, #/compare?ids=…), so the server only
 * ever serves `/`, bookmarks and the back button work, and nothing secret is ever in the URL.
 */

export type Route =
  | { page: 'list', tag?: string, q?: string, replicatesOf?: string }
  | { page: 'sweep', id: string }
  | { page: 'submit', from: string | null }
  | { page: 'compare', ids: string[] }
  | { page: 'missing', hash: string }

/** Filters of the list that live in its URL, so a filtered list can be bookmarked and linked to. */
const LIST_FILTERS = ['tag', 'q', 'replicatesOf'] as const

/** Reads a route from a location hash. Pure. */
export function parseRoute (hash: string): Route {
  const raw = hash.replace(/^#/, '')
  const [path = '', query = ''] = raw.split('?', 2)
  const params = new URLSearchParams(query)
  const parts = path.split('/').filter((p) => p !== '').map((p) => decodeURIComponent(p))
  if (parts.length === 0 || (parts.length === 1 && parts[0] === 'sweeps')) {
    const route: Route = { page: 'list' }
    for (const key of LIST_FILTERS) {
      const value = params.get(key)
      if (value !== null && value !== '') route[key] = value
    }
    return route
  }
  if (parts.length === 2 && parts[0] === 'sweeps' && parts[1] !== undefined) return { page: 'sweep', id: parts[1] }
  if (parts.length === 1 && parts[0] === 'new') return { page: 'submit', from: params.get('from') }
  if (parts.length === 1 && parts[0] === 'compare') {
    const ids = (params.get('ids') ?? '').split(',').map((id) => id.trim()).filter((id) => id !== '')
    return { page: 'compare', ids: [...new Set(ids)] }
  }
  return { page: 'missing', hash: raw }
}

/** The hash of a route, for links. Pure. */
export function routeHref (route: Route): string {
  switch (route.page) {
    case 'list': {
      const params = new URLSearchParams()
      for (const key of LIST_FILTERS) {
        const value = route[key]
        if (value !== undefined && value !== '') params.set(key, value)
      }
      const query = params.toString()
      return query === '' ? '#/' : `#/?${query}`
    }
    case 'sweep': return `#/sweeps/${encodeURIComponent(route.id)}`
    case 'submit': return route.from === null ? '#/new' : `#/new?from=${encodeURIComponent(route.from)}`
    case 'compare': return route.ids.length === 0 ? '#/compare' : `#/compare?ids=${route.ids.map(encodeURIComponent).join(',')}`
    case 'missing': return `#${route.hash}`
  }
}
