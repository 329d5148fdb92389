// Measured traces, fits of runs to traces, and saved waveguides.
import { FitDetail, FitList, FitListQuery, FitRequest } from '@shared/api/fits'
import { TraceData, TraceDataQuery, TraceDetail, TraceList, TraceListQuery, TraceUploadSettings } from '@shared/api/traces'
import { SavedWaveguide, SavedWaveguideCreate, SavedWaveguideDuplicate, SavedWaveguideList, SavedWaveguideListQuery, SavedWaveguideUpdate } from '@shared/api/waveguides-api'
import type { ApiOperation } from '../registry'

const noContent = { status: 204, description: 'Done; no body' }
const waveguide = (status: number, description: string) => ({ status, description, schema: SavedWaveguide })

export const dataOperations: ApiOperation[] = [
  {
    method: 'POST',
    path: '/api/traces',
    tag: 'Traces',
    auth: 'user',
    summary: 'Upload a measured trace (delimited text or NPY) with its import settings',
    multipart: {
      file: { description: 'The trace file', binary: true },
      settings: { description: 'Import settings as a JSON text', schema: TraceUploadSettings },
    },
    response: { status: 201, description: 'The stored trace', schema: TraceDetail },
  },
  { method: 'GET', path: '/api/traces', tag: 'Traces', auth: 'user', summary: "A group's traces, paged", query: TraceListQuery, response: { status: 200, description: 'A page of traces', schema: TraceList } },
  { method: 'GET', path: '/api/traces/:id', tag: 'Traces', auth: 'user', summary: 'One trace with its columns and signals', response: { status: 200, description: 'The trace', schema: TraceDetail } },
  { method: 'GET', path: '/api/traces/:id/data', tag: 'Traces', auth: 'user', summary: "A trace's samples, decimated to maxPoints", query: TraceDataQuery, response: { status: 200, description: 'The samples', schema: TraceData } },
  { method: 'GET', path: '/api/traces/:id/original', tag: 'Traces', auth: 'user', summary: 'The file as uploaded', response: { status: 200, description: 'The original bytes', contentType: 'application/octet-stream' } },
  { method: 'DELETE', path: '/api/traces/:id', tag: 'Traces', auth: 'user', summary: 'Delete a trace and its fits (editors)', response: noContent },

  { method: 'POST', path: '/api/fits', tag: 'Fits', auth: 'user', summary: 'Fit a run to a measured trace (201 when done at once, 202 when queued)', body: FitRequest, response: { status: 202, description: 'The fit', schema: FitDetail } },
  { method: 'GET', path: '/api/fits', tag: 'Fits', auth: 'user', summary: 'Fits of a trace or of a run', query: FitListQuery, response: { status: 200, description: 'Fits', schema: FitList } },
  { method: 'GET', path: '/api/fits/:id', tag: 'Fits', auth: 'user', summary: 'One fit with its parameters and result', response: { status: 200, description: 'The fit', schema: FitDetail } },
  { method: 'DELETE', path: '/api/fits/:id', tag: 'Fits', auth: 'user', summary: 'Delete a fit (stops it when running)', response: noContent },

  { method: 'GET', path: '/api/waveguides', tag: 'Waveguides', auth: 'user', summary: "A group's saved waveguides", query: SavedWaveguideListQuery, response: { status: 200, description: 'Waveguides', schema: SavedWaveguideList } },
  { method: 'POST', path: '/api/waveguides', tag: 'Waveguides', auth: 'user', summary: 'Save a waveguide for the group', body: SavedWaveguideCreate, response: waveguide(201, 'The saved waveguide') },
  { method: 'GET', path: '/api/waveguides/:id', tag: 'Waveguides', auth: 'user', summary: 'One saved waveguide', response: waveguide(200, 'The waveguide') },
  { method: 'PUT', path: '/api/waveguides/:id', tag: 'Waveguides', auth: 'user', summary: 'Replace a saved waveguide', body: SavedWaveguideUpdate, response: waveguide(200, 'The waveguide') },
  { method: 'DELETE', path: '/api/waveguides/:id', tag: 'Waveguides', auth: 'user', summary: 'Delete a saved waveguide', response: noContent },
  { method: 'POST', path: '/api/waveguides/:id/duplicate', tag: 'Waveguides', auth: 'user', summary: 'Copy a saved waveguide under a new name', body: SavedWaveguideDuplicate, response: waveguide(201, 'The copy') },
]
