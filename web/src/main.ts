/** The page shell: picks the page for the URL fragment and tears the previous one down. */
import { focusHeading, h } from './dom.js'
import { renderCompare } from './pages/compare.js'
import { renderList } from './pages/list.js'
import { renderSubmit } from './pages/submit.js'
import { renderSweep } from './pages/sweep.js'
import { parseRoute, type Route } from './router.js'
import { currentToken, forgetToken, onTokenChange } from './token.js'

/** What a page leaves behind to stop its streams and timers. */
export type Dispose = () => void

function renderMissing (main: HTMLElement, hash: string): Dispose {
  main.replaceChildren(
    h('h1', {}, 'No such page'),
    h('p', {}, `Nothing lives at #${hash}. `, h('a', { href: '#/' }, 'Back to the sweeps'), '.'))
  return () => {}
}

function renderRoute (main: HTMLElement, route: Route): Dispose {
  switch (route.page) {
    case 'list': return renderList(main, route)
    case 'sweep': return renderSweep(main, route.id)
    case 'submit': return renderSubmit(main, route.from)
    case 'compare': return renderCompare(main, route.ids)
    case 'missing': return renderMissing(main, route.hash)
  }
}

const TITLES: Record<Route['page'], string> = {
  list: 'Sweeps',
  sweep: 'Sweep',
  submit: 'New sweep',
  compare: 'Compare sweeps',
  missing: 'Not found'
}

function showTokenState (): void {
  const state = document.getElementById('token-state')
  if (state !== null) state.hidden = currentToken() === null
}

function start (): void {
  const main = document.getElementById('main')
  if (main === null) return
  let dispose: Dispose = () => {}
  let first = true

  const navigate = (): void => {
    dispose()
    const route = parseRoute(location.hash)
    document.title = `${TITLES[route.page]} · memsweep`
    for (const link of document.querySelectorAll<HTMLAnchorElement>('[data-nav]')) {
      if (link.dataset.nav === route.page) link.setAttribute('aria-current', 'page')
      else link.removeAttribute('aria-current')
    }
    main.replaceChildren()
    dispose = renderRoute(main, route)
    // On the first load the browser's own focus is right; after a navigation, the new heading.
    if (!first) focusHeading(main)
    first = false
  }

  window.addEventListener('hashchange', navigate)
  // The fragment holds the page, so the skip link moves the focus itself instead of changing it.
  document.querySelector('.skip-link')?.addEventListener('click', (event) => {
    event.preventDefault()
    main.focus()
  })
  document.getElementById('forget-token')?.addEventListener('click', () => {
    forgetToken()
    navigate()
  })
  onTokenChange(showTokenState)
  showTokenState()
  navigate()
}

start()
