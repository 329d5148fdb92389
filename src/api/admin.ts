import { QueueActivity } from '@shared/api/queue'
import { QueueStatus } from '@shared/api/runs'
import { z } from 'zod'
import { api } from './client'

/** One row of GET /api/admin/users (server/modules/auth/admin.routes.ts); shared/ has no schema for it. */
export const AdminUser = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  isAdmin: z.boolean(),
  emailConfirmed: z.boolean(),
  createdAt: z.string(),
  groupCount: z.number().int().nonnegative(),
})
export type AdminUser = z.infer<typeof AdminUser>

export const AdminUserList = z.object({ users: z.array(AdminUser) })
export type AdminUserList = z.infer<typeof AdminUserList>

export const AdminUserPatchResult = z.object({ id: z.string(), isAdmin: z.boolean() })
export type AdminUserPatchResult = z.infer<typeof AdminUserPatchResult>

export const listAdminUsers = () => api.get('/admin/users', { schema: AdminUserList })

export const setUserAdmin = (id: string, isAdmin: boolean) =>
  api.patch(`/admin/users/${encodeURIComponent(id)}`, { isAdmin }, { schema: AdminUserPatchResult })

// Unlike api/queue.ts (which turns 403 into null for the dashboard card), the admin page needs the 403 itself.
export const fetchQueueStatus = () => api.get('/queue', { schema: QueueStatus })

/** The last hour of queue depth and busy solver threads, and each worker with the runs it has finished. */
export const fetchQueueActivity = () => api.get('/queue/activity', { schema: QueueActivity })
