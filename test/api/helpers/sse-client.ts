/** A minimal SSE reader over real HTTP (fetch), for streams that stay open. */
import { parseEventStream } from './harness.js'

export interface OpenStream {
  status: number
  headers: Headers
  /** Every event and comment received so far. */
  received: ReturnType<typeof parseEventStream>
  /** Resolves when the server ends the stream. */
  ended: Promise<void>
  /** Resolves once an item satisfying `predicate` has arrived. */
  until: (predicate: (item: ReturnType<typeof parseEventStream>[number]) => boolean, timeoutMs?: number) => Promise<void>
  abort: () => void
}

export async function openEventStream (url: string, headers: Record<string, string> = {}): Promise<OpenStream> {
  const controller = new AbortController()
  const response = await fetch(url, { headers: { accept: 'text/event-stream', ...headers }, signal: controller.signal })
  const received: ReturnType<typeof parseEventStream> = []
  const waiters: Array<() => void> = []
  let buffer = ''
  const decoder = new TextDecoder()
  const ended = (async () => {
    if (response.body === null) return
    const reader = response.body.getReader()
    try {
      for (;;) {
        const { done, value } = await reader.read()
        if (done) break
        buffer += decoder.decode(value, { stream: true })
        const cut = buffer.lastIndexOf('\n\n')
        if (cut >= 0) {
          received.push(...parseEventStream(buffer.slice(0, cut + 2)))
          buffer = buffer.slice(cut + 2)
          for (const wake of waiters.splice(0)) wake()
        }
      }
    } catch (error) {
      if ((error as Error).name !== 'AbortError') throw error
    } finally {
      for (const wake of waiters.splice(0)) wake()
    }
  })()
  let finished = false
  ended.then(() => { finished = true }, () => { finished = true })
  const until: OpenStream['until'] = async (predicate, timeoutMs = 30_000) => {
    const deadline = Date.now() + timeoutMs
    while (!received.some(predicate)) {
      if (finished) throw new Error(`stream ended without the awaited item; got ${JSON.stringify(received).slice(0, 400)}`)
      if (Date.now() > deadline) throw new Error('timed out waiting for a stream item')
      await new Promise<void>((resolve) => {
        waiters.push(resolve)
        setTimeout(resolve, 250)
      })
    }
  }
  return { status: response.status, headers: response.headers, received, ended, until, abort: () => controller.abort() }
}
