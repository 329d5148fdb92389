import { z } from 'zod'

/** The one error envelope every API route answers with. */
export const ApiErrorBody = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
    requestId: z.string().optional(),
  }),
})
export type ApiErrorBody = z.infer<typeof ApiErrorBody>
