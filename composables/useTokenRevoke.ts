// Revoking an API token (one's own on the profile, any of the organisation's under Admin → Members):
// asked first in the one confirmation dialog, then deleted; the list is read again either way.
import type { Ref } from 'vue'

/** `tokenMessage` and `tokenBusy` are the page's own (its token form shares them). */
export function useTokenRevoke<T extends { id: string }>(urlOf: (id: string) => string, refresh: () => Promise<unknown>, tokenMessage: Ref<string>, tokenBusy: Ref<string>) {
  const pendingToken = ref(null) as Ref<T | null>
  const confirmToken = ref(false)
  function revokeToken(t: T) {
    pendingToken.value = t
    confirmToken.value = true
  }
  async function doRevokeToken() {
    const t = pendingToken.value
    if (!t) return
    pendingToken.value = null
    tokenMessage.value = ''
    tokenBusy.value = t.id
    try {
      await $fetch(urlOf(t.id), { method: 'DELETE' })
    } catch (e) {
      tokenMessage.value = errorMessage(e)
    } finally {
      tokenBusy.value = ''
      await refresh()
    }
  }
  return { pendingToken, confirmToken, revokeToken, doRevokeToken }
}
