import { watch } from 'vue'
import { useRouter } from 'vue-router'
import { useQueryClient } from '@tanstack/vue-query'
import { storeToRefs } from 'pinia'
import { useSessionStore } from '@/stores/session'

/**
 * The one reaction to a session ending, whatever ended it (Sign out, a 401 from any API call, the token's expiry,
 * another tab): forget the cached server data and leave the protected screen for sign-in.
 */
export function useSessionEndRedirect(): void {
  const session = useSessionStore()
  const { isSignedIn } = storeToRefs(session)
  const router = useRouter()
  const queryClient = useQueryClient()

  watch(isSignedIn, (signedIn, wasSignedIn) => {
    if (signedIn || !wasSignedIn) return
    queryClient.clear()
    const current = router.currentRoute.value
    if (!current.meta.requiresAuth) return
    // After an expiry, come back to the same screen; after a deliberate sign out, start fresh.
    const query = session.endReason === 'expired' ? { redirect: current.fullPath, reason: 'expired' } : {}
    void router.replace({ name: 'sign-in', query })
  })
}
