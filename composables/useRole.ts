// The signed-in person's role in the current organisation, for shaping pages (the server decides).
import type { RoleName } from '~~/shared/navigation'

export function useRole() {
  const { session } = useUserSession()
  const role = computed<RoleName | null>(() => session.value?.role ?? null)
  const canEdit = computed(() => role.value === 'admin' || role.value === 'analyst')
  return { role, canEdit }
}
