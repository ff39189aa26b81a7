// Mitigation options saved from the tank what-if by someone signed out (or a viewer): kept for this
// browser tab only. Signed in, options are kept on the server (server/whatif/options.ts).
import { defineStore } from 'pinia'
import type { ParamChange, WhatIfParams } from '~~/shared/results/whatif-params'

export interface WhatIfFigures { sparkingPerYear: number, directPerYear: number, ignitionPerYear: number }

export interface SavedWhatIfOption {
  id: string
  label: string
  savedAt: string
  params: WhatIfParams
  changes: ParamChange[]
  figures: WhatIfFigures
  baselineFigures: WhatIfFigures | null
  engineVersion: string
}

export const useWhatIfStore = defineStore('whatif', () => {
  const saved = ref<SavedWhatIfOption[]>([])
  let counter = 0

  function save(option: Omit<SavedWhatIfOption, 'id' | 'savedAt' | 'label'> & { label?: string }): SavedWhatIfOption {
    counter += 1
    const entry: SavedWhatIfOption = {
      ...option,
      id: `option-${counter}`,
      label: option.label?.trim() || `Option ${counter}`,
      savedAt: new Date().toISOString(),
    }
    saved.value = [...saved.value, entry]
    return entry
  }

  function remove(id: string) {
    saved.value = saved.value.filter(o => o.id !== id)
  }

  return { saved, save, remove }
})
