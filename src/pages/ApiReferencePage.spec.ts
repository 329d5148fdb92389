// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import { getByRole, queryAllByRole } from '@/test-utils/by-role'
import ApiReferencePage from './ApiReferencePage.vue'

// A small description in the shape the server writes (operations under tags, named schemas as components).
const doc = {
  openapi: '3.1.0',
  info: { title: 'API', version: '9.9.9' },
  tags: [{ name: 'Runs', description: 'Simulation runs.' }, { name: 'Service' }],
  paths: {
    '/api/health': { get: { tags: ['Service'], summary: 'Database and queue status', 'x-auth': 'public', parameters: [], responses: { '200': { description: 'Status' } } } },
    '/api/runs': {
      post: {
        tags: ['Runs'],
        summary: 'Submit a simulation run',
        'x-auth': 'user',
        parameters: [{ name: 'Idempotency-Key', in: 'header', required: false, schema: { type: 'string' }, description: 'Makes a retry safe' }],
        requestBody: { content: { 'application/json': { schema: { $ref: '#/components/schemas/RunCreate' } } } },
        responses: { '202': { description: 'The queued run', content: { 'application/json': { schema: { $ref: '#/components/schemas/RunCreate' } } } } },
      },
    },
  },
  components: {
    schemas: {
      RunCreate: { type: 'object', properties: { title: { type: 'string', maxLength: 200, description: 'Short name' } }, required: ['title'] },
      ApiErrorBody: { type: 'object', properties: { error: { type: 'object', properties: { code: { type: 'string' } } } } },
    },
  },
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

async function mountPage() {
  vi.stubGlobal('fetch', fakeFetch({ 'GET /api/openapi.json': { body: doc } }).fn)
  const m = await mountWithApp(ApiReferencePage, { path: '/reference' })
  await flushPromises()
  return m
}

describe('ApiReferencePage', () => {
  it('groups the operations under their tags in the document order, with method, path and summary', async () => {
    await mountPage()
    const headings = queryAllByRole(document.body, 'heading').map((h) => h.textContent?.trim())
    expect(headings.indexOf('Runs')).toBeGreaterThan(-1)
    expect(headings.indexOf('Runs')).toBeLessThan(headings.indexOf('Service'))
    const post = getByRole(document.body, 'button', /POST\s*\/api\/runs\s*Submit a simulation run/)
    expect(post).toBeTruthy()
    expect(document.body.textContent).toContain('2 operations · version 9.9.9')
    // How to authenticate, with the token header spelled out.
    expect(document.body.textContent).toContain('Authorization: Bearer $SONOWEAVE_TOKEN')
  })

  it('shows the request body fields and parameters of an opened operation', async () => {
    await mountPage()
    getByRole(document.body, 'button', /POST\s*\/api\/runs/).click()
    await flushPromises()
    const text = document.body.textContent ?? ''
    expect(text).toContain('Request body (application/json)')
    expect(text).toContain('Idempotency-Key')
    expect(text).toContain('length ≤ 200')
    expect(text).toContain('Short name')
  })
})
