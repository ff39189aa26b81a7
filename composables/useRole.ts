// What the signed-in person's role lets a page offer (the server decides; this only shapes the page).
export function useRole() {
  const { role } = useAccount()
  const canEdit = computed(() => role.value === 'admin' || role.value === 'analyst')
  return { role, canEdit }
}
