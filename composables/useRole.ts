// What the signed-in person's role lets a page offer (the server decides; this only shapes the page).
// Every page asks `may('export')`, `may('plan')`… (the table is shared/permissions.ts).
import { roleMay, type Permission } from '~~/shared/permissions'

export function useRole() {
  const { role } = useAccount()
  const may = (permission: Permission) => roleMay(role.value, permission)
  const canEdit = computed(() => may('editInventory'))
  return { role, may, canEdit }
}
