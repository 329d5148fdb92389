// Parameter sweeps: estimate, submit, list, follow, download.
import { SweepCreate, SweepDefinition, SweepDetail, SweepDownloadQuery, SweepEstimateResponse, SweepList, SweepListQuery } from '@shared/api/sweeps'
import { SensingMapQuery, SensingMapResponse } from '@shared/api/sensing-map'
import type { ApiOperation } from '../registry'

const sweep = (status: number, description: string) => ({ status, description, schema: SweepDetail })

export const sweepsOperations: ApiOperation[] = [
  { method: 'POST', path: '/api/sweeps/estimate', tag: 'Sweeps', auth: 'user', summary: 'Point count and cost of a sweep before submitting it', body: SweepDefinition, response: { status: 200, description: 'The estimate', schema: SweepEstimateResponse } },
  { method: 'POST', path: '/api/sweeps', tag: 'Sweeps', auth: 'user', summary: 'Submit a parameter sweep (one run per point)', body: SweepCreate, response: sweep(202, 'The sweep (Location: its address)') },
  { method: 'GET', path: '/api/sweeps', tag: 'Sweeps', auth: 'user', summary: "A group's sweeps, paged", query: SweepListQuery, response: { status: 200, description: 'A page of sweeps', schema: SweepList } },
  { method: 'GET', path: '/api/sweeps/:id', tag: 'Sweeps', auth: 'shareable', summary: 'One sweep with its points and figures', response: sweep(200, 'The sweep') },
  { method: 'POST', path: '/api/sweeps/:id/cancel', tag: 'Sweeps', auth: 'user', summary: "Cancel a sweep's queued and running points", response: sweep(200, 'The sweep') },
  { method: 'POST', path: '/api/sweeps/:id/rerun-failed', tag: 'Sweeps', auth: 'user', summary: 'Queue the failed points again', response: sweep(202, 'The sweep') },
  {
    method: 'GET',
    path: '/api/sweeps/:id/download',
    tag: 'Sweeps',
    auth: 'shareable',
    summary: "A sweep's figures as CSV in a ZIP, with every point's arrays when arrays=1",
    query: SweepDownloadQuery,
    response: { status: 200, description: 'The ZIP archive', contentType: 'application/zip' },
  },
  {
    method: 'GET',
    path: '/api/sweeps/:id/sensing-map',
    tag: 'Sweeps',
    auth: 'shareable',
    summary: 'Gain against position and frequency of a sensing scan, with the fitted shift profile, resolution, range and hot spots (format=csv or npy for files): a detuning sweep with a pulsed pump and a CW probe (time-of-flight read-out), or a sweep of the detuning and the Stokes source delay with a CW pump and probe sharing one frequency modulation (correlation read-out)',
    query: SensingMapQuery,
    response: { status: 200, description: 'The map and its fits', schema: SensingMapResponse },
  },
]
