// As main.ts: zod without compiled parsers, and validation issues in plain words.
import '@/zod-jitless'
import { mount, flushPromises, type ComponentMountingOptions } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory } from 'vue-router'
import type { Component } from 'vue'
import { createAppVuetify } from '@/plugins/vuetify'
import { createAppRouter } from '@/router'

export interface AppMountOptions {
  /** Where the router starts. */
  path?: string
  props?: Record<string, unknown>
}

/** Mounts a component with the app's own Vuetify (themes, defaults), a fresh Pinia and the real routes. */
export async function mountWithApp(component: Component, opts: AppMountOptions = {}) {
  const pinia = createPinia()
  setActivePinia(pinia)
  const vuetify = createAppVuetify()
  const router = createAppRouter(createMemoryHistory())
  await router.push(opts.path ?? '/')
  await router.isReady()

  const wrapper = mount(component, {
    props: opts.props,
    attachTo: document.body,
    global: { plugins: [pinia, vuetify, router] },
  } as ComponentMountingOptions<typeof component>)
  await flushPromises()
  return { wrapper, router, pinia, vuetify }
}

type JsonReply = { status?: number; body?: unknown }

/** A fetch stand-in answering by "METHOD /path"; unknown routes get 404 with the API's error envelope. */
export function fakeFetch(routes: Record<string, JsonReply | (() => JsonReply)>) {
  const calls: { method: string; url: string; init?: RequestInit }[] = []
  const fn = async (input: RequestInfo | URL, init?: RequestInit): Promise<Response> => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url
    const method = (init?.method ?? 'GET').toUpperCase()
    calls.push({ method, url, init })
    const entry = routes[`${method} ${url.split('?')[0]}`]
    const reply = typeof entry === 'function' ? entry() : entry
    const status = reply?.status ?? (reply ? 200 : 404)
    const body = reply ? reply.body : { error: { code: 'not_found', message: `No route ${method} ${url}` } }
    return new Response(body === undefined ? null : JSON.stringify(body), {
      status,
      headers: { 'Content-Type': 'application/json' },
    })
  }
  return { fn, calls }
}
