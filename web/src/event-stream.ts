/**
 * A text/event-stream parser for streams read with fetch(). EventSource cannot send an
 * Authorization header, and a token must never travel in a URL, so the page reads the event
 * route as a plain streamed response and parses it here. Follows the WHATWG parsing rules:
 * CR, LF or CRLF line ends, `field: value` with one optional space, comments start with `:`,
 * a blank line dispatches. Pure: no DOM.
 */

export interface StreamEvent {
  /** `message` when the event names no type. */
  event: string
  data: string
  id: string | null
}

export class EventStreamParser {
  #buffer = ''
  #event = ''
  #data: string[] = []
  #id: string | null = null
  #lastId: string | null = null
  #retry: number | null = null
  #pendingCr = false

  /** The `retry:` interval the server last asked for, in ms, or null. */
  get retry (): number | null { return this.#retry }
  /** The last event id seen, for a reconnection's Last-Event-ID. */
  get lastId (): string | null { return this.#lastId }

  /** Feeds decoded text; returns the events it completes. */
  push (text: string): StreamEvent[] {
    let chunk = text
    // A CR at the end of the previous chunk may be the first half of a CRLF.
    if (this.#pendingCr && chunk.startsWith('\n')) chunk = chunk.slice(1)
    this.#pendingCr = false
    this.#buffer += chunk
    const events: StreamEvent[] = []
    let start = 0
    for (let i = 0; i < this.#buffer.length; i++) {
      const c = this.#buffer[i]
      if (c !== '\n' && c !== '\r') continue
      const line = this.#buffer.slice(start, i)
      if (c === '\r') {
        if (i + 1 === this.#buffer.length) this.#pendingCr = true
        else if (this.#buffer[i + 1] === '\n') i++
      }
      start = i + 1
      const event = this.#line(line)
      if (event !== null) events.push(event)
    }
    this.#buffer = this.#buffer.slice(start)
    return events
  }

  #line (line: string): StreamEvent | null {
    if (line === '') return this.#dispatch()
    if (line.startsWith(':')) return null
    const colon = line.indexOf(':')
    const field = colon === -1 ? line : line.slice(0, colon)
    let value = colon === -1 ? '' : line.slice(colon + 1)
    if (value.startsWith(' ')) value = value.slice(1)
    if (field === 'event') this.#event = value
    else if (field === 'data') this.#data.push(value)
    else if (field === 'id' && !value.includes('\u0000')) this.#id = value
    else if (field === 'retry' && /^\d+$/.test(value)) this.#retry = Number(value)
    return null
  }

  #dispatch (): StreamEvent | null {
    if (this.#id !== null) this.#lastId = this.#id
    const hadData = this.#data.length > 0
    const event: StreamEvent = { event: this.#event === '' ? 'message' : this.#event, data: this.#data.join('\n'), id: this.#id }
    this.#event = ''
    this.#data = []
    this.#id = null
    return hadData ? event : null
  }
}
