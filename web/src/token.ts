/**
 * The bearer token of a server that requires one. It lives in this tab's sessionStorage only:
 * never in a URL, a cookie, localStorage or the console, and it is gone when the tab closes.
 */
import { h } from './dom.js'

const KEY = 'memsweep.token'
const listeners = new Set<() => void>()

export function currentToken (): string | null {
  try {
    return sessionStorage.getItem(KEY)
  } catch {
    return null
  }
}

function store (token: string | null): void {
  try {
    if (token === null) sessionStorage.removeItem(KEY)
    else sessionStorage.setItem(KEY, token)
  } catch {
    // Storage refused (private mode quotas): the token then lasts for this page load only.
  }
  for (const listener of listeners) listener()
}

export function forgetToken (): void {
  store(null)
}

/** Calls `listener` whenever the token is set or forgotten. */
export function onTokenChange (listener: () => void): void {
  listeners.add(listener)
}

let asking: Promise<string | null> | null = null

/**
 * Asks for a token in a modal dialog; resolves with it (stored) or null when the person
 * dismisses the dialog. Concurrent callers share one dialog.
 */
export function askForToken (rejected: boolean): Promise<string | null> {
  asking ??= showDialog(rejected).finally(() => { asking = null })
  return asking
}

function showDialog (rejected: boolean): Promise<string | null> {
  return new Promise((resolve) => {
    const input = h('input', {
      id: 'token-input',
      type: 'password',
      name: 'token',
      autocomplete: 'off',
      spellcheck: 'false',
      required: true,
      minlength: 16,
      'aria-describedby': 'token-help'
    })
    const problem = rejected
      ? h('p', { class: 'field-error', role: 'alert' }, 'The server did not accept that token. Check it and try again.')
      : null
    const form = h('form', { method: 'dialog', class: 'token-form' },
      h('h2', { id: 'token-title' }, 'This server needs an access token'),
      h('p', { id: 'token-help' },
        'Sweeps on this server belong to their owners. Paste the token your lab admin gave you. ',
        'It stays in this browser tab only and is sent in the Authorization header; closing the tab forgets it.'),
      problem,
      h('label', { for: 'token-input' }, 'Access token'),
      input,
      h('div', { class: 'actions' },
        h('button', { type: 'submit', class: 'primary', value: 'use' }, 'Use token'),
        h('button', { type: 'button', class: 'secondary', value: 'cancel', onclick: () => dialog.close('cancel') }, 'Not now')))
    const dialog = h('dialog', { class: 'token-dialog', 'aria-labelledby': 'token-title' }, form)
    dialog.addEventListener('close', () => {
      const token = input.value.trim()
      dialog.remove()
      if (dialog.returnValue === 'use' && token !== '') {
        store(token)
        resolve(token)
      } else {
        resolve(null)
      }
    })
    document.body.append(dialog)
    dialog.showModal()
    input.focus()
  })
}
