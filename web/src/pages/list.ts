/**
 * The lab's sweeps, newest first, each shown by what a researcher recognises it by: its
 * label and seed, the model in one line, a thumbnail of its main curve, its tags and notes;
 * beside them its state with live progress. Filters by state, tag and words (label, notes),
 * narrows to the replicates of one sweep, can fold replicates together, cancels, and picks
 * finished sweeps to compare.
 */
import { ApiProblem, cancelSweep, followSweep, getJson, getSweep, listSweeps, sweepPath, TERMINAL, type ListFilter } from '../api.js'
import { fill, h } from '../dom.js'
import { formatAgo, formatStamp } from '../format.js'
import { parameterName } from '../labels.js'
import type { Dispose } from '../main.js'
import { modelLine } from '../model-line.js'
import { routeHref, type Route } from '../router.js'
import { tagMarks } from '../sweep-workflow.js'
import { thumbnailCaption, thumbnailOf, type Thumbnail } from '../curves.js'
import { drawThumbnail } from '../thumbnail.js'
import { STATUS_NAMES, type Spec, type SweepResult, type SweepStatus, type SweepStatusName } from '../types.js'
import { inBackground, confirmAction, messageOf, notify, progressView, statusBadge, statusWord, type ProgressView } from '../widgets.js'

/** Event streams the list keeps open at once: browsers allow about six connections per server. */
const MAX_STREAMS = 3
/** How often the list itself is re-read, to show sweeps submitted elsewhere. */
const REFRESH_MS = 8000
const PAGE_SIZE = 25
/** Spec and result reads in flight at once while the list fills in its model lines and thumbnails. */
const FACT_READS = 2

/**
 * What never changes for a sweep id, kept for the tab's life: its spec, and its thumbnail once
 * it succeeded (null: it has no curve). Going back to the list costs no request.
 */
const specs = new Map<string, Spec>()
const thumbnails = new Map<string, Thumbnail | null>()

interface Entry {
  status: SweepStatus
  li: HTMLLIElement
  progress: ProgressView
  statusSlot: HTMLElement
  actionSlot: HTMLElement
  pickSlot: HTMLElement
  thumbSlot: HTMLElement
  modelSlot: HTMLElement
  seedSlot: HTMLElement
  groupSlot: HTMLElement
  stream: AbortController | null
}

let rememberedStatus: SweepStatusName | null = null
let rememberedGrouping = false

export function renderList (main: HTMLElement, route: Extract<Route, { page: 'list' }> = { page: 'list' }): Dispose {
  const stop = new AbortController()
  const entries = new Map<string, Entry>()
  const selected = new Set<string>()
  const filter: ListFilter = { status: rememberedStatus, tag: route.tag ?? null, q: route.q ?? null, replicatesOf: route.replicatesOf ?? null }
  let grouped = rememberedGrouping
  let cursor: string | null = null
  let showOwner = false

  const list = h('ol', { class: 'sweep-list', 'aria-label': 'Sweeps, newest first' })
  const empty = h('p', { class: 'empty', hidden: true })
  const more = h('button', { type: 'button', class: 'secondary', hidden: true, onclick: () => { inBackground(load(false)) } }, 'Show older sweeps')
  const problem = h('p', { class: 'page-error', role: 'alert', hidden: true })
  const compareLink = h('a', { class: 'button secondary', href: '#/compare', 'aria-disabled': 'true' }, 'Compare selected')
  const compareHint = h('span', { class: 'hint', id: 'compare-hint' }, 'Tick two or more finished sweeps to compare them.')

  /** Filters live in the URL (except the state, remembered for the tab), so a filtered list can be linked to. */
  const setRouteFilter = (): void => {
    const next = routeHref({
      page: 'list',
      ...(filter.tag === null || filter.tag === undefined ? {} : { tag: filter.tag }),
      ...(filter.q === null || filter.q === undefined ? {} : { q: filter.q }),
      ...(filter.replicatesOf === null || filter.replicatesOf === undefined ? {} : { replicatesOf: filter.replicatesOf })
    })
    history.replaceState(null, '', next)
    inBackground(load(true))
  }

  const statusSelect = h('select', {
    id: 'status-filter',
    onchange: () => {
      filter.status = statusSelect.value === '' ? null : statusSelect.value as SweepStatusName
      rememberedStatus = filter.status
      inBackground(load(true))
    }
  },
  h('option', { value: '' }, 'all states'),
  STATUS_NAMES.map((name) => h('option', { value: name, selected: name === filter.status }, statusWord(name))))

  let typing: ReturnType<typeof setTimeout> | null = null
  const later = (action: () => void): void => {
    if (typing !== null) clearTimeout(typing)
    typing = setTimeout(action, 350)
  }
  const tagInput = h('input', { id: 'tag-filter', type: 'search', value: filter.tag ?? '', placeholder: 'any tag', autocomplete: 'off', list: 'known-tags', oninput: () => later(() => { filter.tag = tagInput.value.trim() === '' ? null : tagInput.value.trim(); setRouteFilter() }) })
  const knownTags = h('datalist', { id: 'known-tags' })
  const searchInput = h('input', { id: 'text-filter', type: 'search', value: filter.q ?? '', placeholder: 'label or notes', autocomplete: 'off', oninput: () => later(() => { filter.q = searchInput.value.trim() === '' ? null : searchInput.value.trim(); setRouteFilter() }) })
  const groupBox = h('input', { id: 'group-replicates', type: 'checkbox', checked: grouped, onchange: () => { grouped = groupBox.checked; rememberedGrouping = grouped; regroup() } })
  const replicateBanner = h('p', { class: 'filter-banner', hidden: filter.replicatesOf === null },
    'Replicates of one sweep (the same spec but for seed and label). ',
    h('a', { href: '#/', onclick: (event: Event) => { event.preventDefault(); filter.replicatesOf = null; replicateBanner.hidden = true; setRouteFilter() } }, 'Show every sweep'))

  main.append(
    h('div', { class: 'page-head' },
      h('h1', {}, 'Sweeps'),
      h('a', { class: 'button primary', href: '#/new' }, 'New sweep')),
    h('div', { class: 'toolbar list-filters', role: 'search' },
      h('div', { class: 'control' }, h('label', { for: 'status-filter' }, 'State'), statusSelect),
      h('div', { class: 'control' }, h('label', { for: 'tag-filter' }, 'Tag'), tagInput, knownTags),
      h('div', { class: 'control' }, h('label', { for: 'text-filter' }, 'Words'), searchInput),
      h('div', { class: 'control checkbox' }, groupBox, h('label', { for: 'group-replicates' }, 'Fold replicates together')),
      h('div', { class: 'compare-bar' }, compareHint, compareLink)),
    replicateBanner,
    problem,
    list,
    empty,
    h('div', { class: 'list-foot' }, more))

  const updateCompare = (): void => {
    const ids = [...selected]
    const ready = ids.length >= 2
    compareLink.setAttribute('aria-disabled', String(!ready))
    compareLink.href = ready ? routeHref({ page: 'compare', ids }) : '#/compare'
    compareHint.textContent = ready ? `${ids.length} finished sweeps picked.` : 'Tick two or more finished sweeps to compare them.'
  }

  const openStreams = (): void => {
    let open = [...entries.values()].filter((entry) => entry.stream !== null).length
    for (const entry of entries.values()) {
      if (open >= MAX_STREAMS) break
      if (entry.stream !== null || TERMINAL.has(entry.status.status)) continue
      const controller = new AbortController()
      stop.signal.addEventListener('abort', () => controller.abort(), { once: true })
      entry.stream = controller
      open++
      followSweep(entry.status.id, (status) => updateEntry(entry, status), controller.signal)
        .catch(() => undefined)
        .finally(() => {
          entry.stream = null
          if (!stop.signal.aborted) openStreams()
        })
    }
  }

  const actionsFor = (entry: Entry): Node[] => {
    const { status } = entry
    if (TERMINAL.has(status.status)) return []
    const label = status.label ?? status.id
    return [h('button', {
      type: 'button',
      class: 'small danger-outline',
      'aria-label': `Cancel ${label}`,
      onclick: async () => {
        const sure = await confirmAction({
          title: 'Cancel this sweep?',
          body: `“${label}” stops within about a second. The points it finished are kept, so it can be resumed from its page.`,
          confirm: 'Cancel sweep',
          keep: 'Keep it running'
        })
        if (!sure) return
        try {
          updateEntry(entry, await cancelSweep(status.id))
          notify(`Canceled “${label}”.`)
        } catch (error) {
          notify(`Could not cancel: ${messageOf(error)}`, 'error')
        }
      }
    }, 'Cancel')]
  }

  const pickFor = (status: SweepStatus): Node => {
    const label = status.label ?? status.id
    if (status.status !== 'succeeded') return h('span', { class: 'visually-hidden' }, 'not finished')
    return h('input', {
      type: 'checkbox',
      'aria-label': `Pick “${label}” to compare`,
      checked: selected.has(status.id),
      onchange: (event: Event) => {
        if ((event.target as HTMLInputElement).checked) selected.add(status.id)
        else selected.delete(status.id)
        updateCompare()
      }
    })
  }

  /** Shows what is known of the sweep's spec and curve. */
  const paintFacts = (entry: Entry): void => {
    const { id, status } = { id: entry.status.id, status: entry.status.status }
    const spec = specs.get(id)
    if (spec !== undefined) {
      entry.modelSlot.textContent = modelLine(spec)
      entry.seedSlot.textContent = typeof spec.seed === 'number' ? `seed ${spec.seed}` : ''
    }
    const known = thumbnails.has(id)
    const thumb = thumbnails.get(id) ?? null
    if (thumb !== null) {
      fill(entry.thumbSlot, drawThumbnail(thumb, parameterName(thumb.x)), h('span', { class: 'thumb-axis' }, thumbnailCaption(thumb)))
      entry.thumbSlot.dataset.state = 'drawn'
      return
    }
    const word = known ? 'no curve' : status === 'succeeded' ? '' : statusWord(status)
    entry.thumbSlot.dataset.state = known ? 'none' : status === 'succeeded' ? 'loading' : status
    fill(entry.thumbSlot, h('span', { class: 'thumb-placeholder' }, word))
  }

  /** Paints what is known and asks for what is missing (a spec once, a result once the sweep succeeded). */
  const showFacts = (entry: Entry): void => {
    paintFacts(entry)
    const id = entry.status.id
    if (!specs.has(id) || (entry.status.status === 'succeeded' && !thumbnails.has(id))) wanted.add(id)
    pump()
  }

  /** Sweep ids whose spec or thumbnail is to be read, and the reads in flight. */
  const wanted = new Set<string>()
  let reading = 0
  const pump = (): void => {
    while (reading < FACT_READS && wanted.size > 0 && !stop.signal.aborted) {
      const id = wanted.values().next().value as string
      wanted.delete(id)
      reading++
      readFacts(id).catch(() => undefined).finally(() => {
        reading--
        const entry = entries.get(id)
        if (entry !== undefined && !stop.signal.aborted) {
          paintFacts(entry)
          regroup()
        }
        pump()
      })
    }
  }
  const readFacts = async (id: string): Promise<void> => {
    if (!specs.has(id)) specs.set(id, (await getSweep(id, stop.signal)).spec)
    const entry = entries.get(id)
    if (entry?.status.status === 'succeeded' && !thumbnails.has(id)) {
      const result = await getJson<SweepResult>(`${sweepPath(id)}/results`, { signal: stop.signal })
      thumbnails.set(id, thumbnailOf(result))
    }
  }

  function updateEntry (entry: Entry, status: SweepStatus): void {
    const changed = entry.status.status !== status.status
    entry.status = status
    entry.progress.update(status)
    entry.li.dataset.status = status.status
    if (changed) {
      fill(entry.statusSlot, statusBadge(status.status))
      fill(entry.actionSlot, ...actionsFor(entry))
      fill(entry.pickSlot, pickFor(status))
      showFacts(entry)
    }
  }

  const buildEntry = (status: SweepStatus): Entry => {
    const label = status.label ?? 'Untitled sweep'
    const progress = progressView(label, true)
    const statusSlot = h('div', { class: 'entry-status' }, statusBadge(status.status))
    const actionSlot = h('div', { class: 'entry-actions' })
    const pickSlot = h('div', { class: 'entry-pick' }, pickFor(status))
    const thumbSlot = h('div', { class: 'entry-thumb' })
    const modelSlot = h('p', { class: 'model-line' })
    const seedSlot = h('span', { class: 'seed' })
    const groupSlot = h('div', { class: 'entry-replicates', hidden: true })
    const li = h('li', { class: 'sweep-entry', 'data-id': status.id, 'data-status': status.status },
      pickSlot,
      thumbSlot,
      h('div', { class: 'entry-main' },
        h('div', { class: 'entry-title' }, h('a', { class: 'entry-label', href: routeHref({ page: 'sweep', id: status.id }) }, label), seedSlot),
        modelSlot,
        h('div', { class: 'entry-meta' },
          tagMarks(status.tags),
          status.notes === null ? null : h('span', { class: 'entry-notes', title: status.notes }, status.notes.length > 90 ? `${status.notes.slice(0, 88)}…` : status.notes)),
        groupSlot),
      h('div', { class: 'entry-side' },
        statusSlot,
        progress.el,
        h('p', { class: 'entry-when' },
          h('time', { datetime: status.createdAt, title: formatStamp(status.createdAt) }, formatAgo(status.createdAt, Date.now())),
          h('span', { class: 'entry-owner', hidden: !showOwner }, ` · ${status.owner ?? '–'}`),
          h('code', { class: 'entry-id', title: status.id }, ` · ${status.id.slice(0, 8)}`)),
        actionSlot))
    const entry: Entry = { status, li, progress, statusSlot, actionSlot, pickSlot, thumbSlot, modelSlot, seedSlot, groupSlot, stream: null }
    progress.update(status)
    fill(actionSlot, ...actionsFor(entry))
    return entry
  }

  /** With "fold replicates": the newest of each replicate set shows the others as a line of links. */
  function regroup (): void {
    const leaders = new Map<string, Entry>()
    for (const entry of entries.values()) {
      entry.li.hidden = false
      entry.groupSlot.hidden = true
    }
    if (!grouped) return
    const followers = new Map<string, Entry[]>()
    for (const entry of entries.values()) {
      const key = entry.status.replicateKey
      const leader = leaders.get(key)
      if (leader === undefined) { leaders.set(key, entry); continue }
      entry.li.hidden = true
      followers.set(key, [...(followers.get(key) ?? []), entry])
    }
    for (const [key, others] of followers) {
      const leader = leaders.get(key)
      if (leader === undefined) continue
      leader.groupSlot.hidden = false
      fill(leader.groupSlot,
        h('span', {}, `${others.length} more replicate${others.length === 1 ? '' : 's'}: `),
        others.flatMap((other, index) => {
          const seed = specs.get(other.status.id)?.seed
          return [index === 0 ? null : ', ', h('a', { href: routeHref({ page: 'sweep', id: other.status.id }) }, typeof seed === 'number' ? `seed ${seed}` : (other.status.label ?? other.status.id.slice(0, 8)))]
        }),
        ' · ',
        h('a', { href: routeHref({ page: 'list', replicatesOf: leader.status.id }) }, 'list them'))
    }
  }

  const setOwnerColumn = (items: SweepStatus[]): void => {
    if (!items.some((item) => item.owner !== null) || showOwner) return
    showOwner = true
    for (const cell of list.querySelectorAll<HTMLElement>('.entry-owner')) cell.hidden = false
  }

  const learnTags = (): void => {
    const tags = [...new Set([...entries.values()].flatMap((entry) => entry.status.tags))].sort()
    fill(knownTags, tags.map((tag) => h('option', { value: tag })))
  }

  const place = (items: SweepStatus[], atTop: boolean): void => {
    for (const status of atTop ? [...items].reverse() : items) {
      const known = entries.get(status.id)
      if (known !== undefined) { updateEntry(known, status); continue }
      const entry = buildEntry(status)
      entries.set(status.id, entry)
      if (atTop) list.prepend(entry.li)
      else list.append(entry.li)
      showFacts(entry)
    }
    learnTags()
    regroup()
  }

  const describeFilter = (): string => {
    const parts = [
      filter.status === null || filter.status === undefined ? null : statusWord(filter.status),
      filter.tag === null || filter.tag === undefined ? null : `tagged “${filter.tag}”`,
      filter.q === null || filter.q === undefined ? null : `mentioning “${filter.q}”`
    ].filter((part) => part !== null)
    return parts.length === 0 ? '' : parts.join(', ')
  }

  let loading = false
  async function load (reset: boolean): Promise<void> {
    if (loading) return
    loading = true
    try {
      const page = await listSweeps({ ...filter, cursor: reset ? null : cursor, limit: PAGE_SIZE }, stop.signal)
      problem.hidden = true
      if (reset) {
        for (const entry of entries.values()) entry.stream?.abort()
        entries.clear()
        list.replaceChildren()
      }
      setOwnerColumn(page.items)
      place(page.items, false)
      cursor = page.nextCursor
      more.hidden = cursor === null
      empty.hidden = entries.size > 0
      list.hidden = entries.size === 0
      const described = describeFilter()
      fill(empty, described === '' && filter.replicatesOf === null
        ? ['No sweeps yet. ', h('a', { href: '#/new' }, 'Start one from an example'), '.']
        : [`No sweeps ${described === '' ? 'here' : described}.`])
      openStreams()
    } catch (error) {
      if (stop.signal.aborted) return
      problem.hidden = false
      problem.textContent = error instanceof ApiProblem && error.status === 401
        ? 'The sweeps are only shown with a valid access token.'
        : `Could not load the sweeps: ${messageOf(error)}`
    } finally {
      loading = false
    }
  }

  /** Re-reads the first page: new sweeps go on top, known ones are updated. */
  async function refresh (): Promise<void> {
    if (loading || document.hidden) return
    try {
      const page = await listSweeps({ ...filter, limit: PAGE_SIZE }, stop.signal)
      setOwnerColumn(page.items)
      place(page.items, true)
      empty.hidden = entries.size > 0
      list.hidden = entries.size === 0
      openStreams()
    } catch {
      // The next refresh tries again; a lasting problem shows on the next full load.
    }
  }

  const ticker = setInterval(() => {
    const now = Date.now()
    for (const entry of entries.values()) entry.progress.tick(now)
  }, 1000)
  const refresher = setInterval(() => { inBackground(refresh()) }, REFRESH_MS)
  updateCompare()
  inBackground(load(true))

  return () => {
    stop.abort()
    if (typing !== null) clearTimeout(typing)
    clearInterval(ticker)
    clearInterval(refresher)
  }
}
