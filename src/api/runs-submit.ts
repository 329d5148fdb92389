import { RunCreate, RunSummary, type RunCreateInput } from '@shared/api/runs'
import { api } from './client'

/**
 * Queues a run: POST /api/runs answers 202 with the run. The request is checked with the same schema the
 * API validates with, so a bad draft never leaves the browser; the answer is read as a summary (a fuller
 * run record parses too, extra fields are dropped).
 */
export async function submitRun(request: RunCreateInput): Promise<RunSummary> {
  const body = RunCreate.parse(request)
  return api.post('/runs', body, { schema: RunSummary })
}
