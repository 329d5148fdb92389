// Simulation runs: submit, list, follow, fetch arrays, download.
import { RunBlockEvent, RunClone, RunCreate, RunDetail, RunList, RunListQuery, RunProgressEvent, RunStatusEvent } from '@shared/api/runs'
import { RunEstimateRequest, RunEstimateResponse, SpeedCalibration } from '@shared/api/estimates'
import type { ApiOperation } from '../registry'

const run = (status: number, description: string) => ({ status, description, schema: RunDetail })

export const runsOperations: ApiOperation[] = [
  {
    method: 'POST',
    path: '/api/runs',
    tag: 'Runs',
    auth: 'user',
    summary: 'Submit a simulation run to the queue',
    description: 'The run starts queued; follow it with GET /api/runs/{id}/events or by polling GET /api/runs/{id}.',
    body: RunCreate,
    headers: [{ name: 'Idempotency-Key', description: '1 to 200 visible ASCII characters; a retry with the same key returns the first run (with Idempotent-Replayed: true) instead of a second one' }],
    response: run(202, 'The queued run (Location: its address)'),
  },
  { method: 'POST', path: '/api/runs/estimate', tag: 'Runs', auth: 'user', summary: 'Cost and expected time of a run before submitting it, with where the time comes from', body: RunEstimateRequest, response: { status: 200, description: 'The estimate', schema: RunEstimateResponse } },
  { method: 'GET', path: '/api/runs/speed', tag: 'Runs', auth: 'user', summary: "The solver speed this server measured on its recent runs, per kind of run (the form's estimate uses it)", response: { status: 200, description: 'Measured speeds', schema: SpeedCalibration } },
  { method: 'GET', path: '/api/runs', tag: 'Runs', auth: 'user', summary: "A group's runs, filtered, sorted and paged", query: RunListQuery, response: { status: 200, description: 'A page of runs', schema: RunList } },
  { method: 'GET', path: '/api/runs/:id', tag: 'Runs', auth: 'shareable', summary: 'One run with its configuration, state and figures', response: run(200, 'The run') },
  { method: 'POST', path: '/api/runs/:id/cancel', tag: 'Runs', auth: 'user', summary: 'Cancel a queued or running run (editors)', response: run(200, 'The run') },
  { method: 'POST', path: '/api/runs/:id/clone', tag: 'Runs', auth: 'user', summary: 'Queue a copy of a run with the same configuration', body: RunClone, response: run(202, 'The new run') },
  {
    method: 'GET',
    path: '/api/runs/:id/events',
    tag: 'Runs',
    auth: 'shareable',
    summary: "Server-sent events of a run's state, progress and map blocks",
    description:
      'Each event has an id; reconnect with the Last-Event-ID header (or ?lastEventId=) to get only later events. The stream ends after the final status event; a finished run with nothing new answers 204.',
    response: { status: 200, description: 'The event stream', contentType: 'text/event-stream', events: { status: RunStatusEvent, progress: RunProgressEvent, block: RunBlockEvent } },
  },
  {
    method: 'GET',
    path: '/api/runs/:id/arrays/:name',
    tag: 'Runs',
    auth: 'shareable',
    summary: "One result array of a finished run, as raw bytes or JSON",
    description: 'Binary answers are little-endian with the NumPy dtype in X-Dtype and the shape in X-Shape; complex arrays interleave real and imaginary parts.',
    response: { status: 200, description: 'The array', contentType: 'application/octet-stream' },
  },
  {
    method: 'GET',
    path: '/api/runs/:id/download',
    tag: 'Runs',
    auth: 'shareable',
    summary: 'A finished run as a ZIP: manifest.json, every array as NPY, port traces as CSV, README.txt',
    response: { status: 200, description: 'The ZIP archive', contentType: 'application/zip' },
  },
]
