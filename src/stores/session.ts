import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { fetchMe, signOut as apiSignOut, type Membership, type MeUser } from '@/api/me'
import { ApiError } from '@/api/client'

const GROUP_KEY = 'sonoweave.currentGroupId'

function storedGroupId(): string | null {
  try {
    return globalThis.localStorage?.getItem(GROUP_KEY) ?? null
  } catch {
    return null
  }
}

/** Who is signed in and which group they are working in. Cross-page state only; pages fetch their own data. */
export const useSessionStore = defineStore('session', () => {
  const user = ref<MeUser | null>(null)
  const memberships = ref<Membership[]>([])
  const currentGroupId = ref<string | null>(null)
  /** 'idle' before the first load; 'error' means /api/me failed for a reason other than "not signed in". */
  const status = ref<'idle' | 'loading' | 'ready' | 'error'>('idle')
  const loadError = ref<ApiError | null>(null)

  const isSignedIn = computed(() => user.value !== null)
  const isAdmin = computed(() => user.value?.isAdmin === true)
  const currentMembership = computed(
    () => memberships.value.find((m) => m.groupId === currentGroupId.value) ?? null,
  )
  const currentGroup = computed(() =>
    currentMembership.value ? { id: currentMembership.value.groupId, name: currentMembership.value.groupName } : null,
  )
  const role = computed(() => currentMembership.value?.role ?? null)
  const canEdit = computed(() => role.value === 'owner' || role.value === 'editor')

  function clear() {
    user.value = null
    memberships.value = []
    currentGroupId.value = null
  }

  function selectGroup(groupId: string) {
    if (!memberships.value.some((m) => m.groupId === groupId)) return
    currentGroupId.value = groupId
    try {
      globalThis.localStorage?.setItem(GROUP_KEY, groupId)
    } catch {
      // The choice holds for this tab even when storage is blocked.
    }
  }

  let inFlight: Promise<void> | null = null
  /** Loads /api/me. Concurrent callers share one request. 401/404 leave the session anonymous, not broken. */
  function load(): Promise<void> {
    inFlight ??= (async () => {
      status.value = 'loading'
      loadError.value = null
      try {
        const me = await fetchMe()
        if (!me) {
          clear()
        } else {
          user.value = me.user
          memberships.value = me.memberships
          const preferred = [storedGroupId(), me.currentGroupId].find((id) =>
            me.memberships.some((m) => m.groupId === id),
          )
          currentGroupId.value = preferred ?? me.memberships[0]?.groupId ?? null
        }
        status.value = 'ready'
      } catch (e) {
        clear()
        loadError.value = e instanceof ApiError ? e : new ApiError(0, 'unknown', String(e))
        status.value = 'error'
      } finally {
        inFlight = null
      }
    })()
    return inFlight
  }

  async function ensureLoaded(): Promise<void> {
    if (status.value === 'idle') await load()
    else if (inFlight) await inFlight
  }

  async function signOut(): Promise<void> {
    try {
      await apiSignOut()
    } finally {
      clear()
    }
  }

  return {
    user,
    memberships,
    currentGroupId,
    status,
    loadError,
    isSignedIn,
    isAdmin,
    currentMembership,
    currentGroup,
    role,
    canEdit,
    load,
    ensureLoaded,
    selectGroup,
    signOut,
    clear,
  }
})
