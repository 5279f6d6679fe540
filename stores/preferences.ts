import { defineStore } from 'pinia'
import type { UnitSystem } from '#shared/types/auth'

// The signed-in person's display preferences, shared by every page. Saved to their profile.
export const usePreferencesStore = defineStore('preferences', () => {
  const units = ref<UnitSystem>('metric')
  const saving = ref(false)
  const error = ref<string | null>(null)

  function load(from: UnitSystem | undefined) {
    if (from) units.value = from
  }

  async function setUnits(next: UnitSystem) {
    const previous = units.value
    units.value = next
    saving.value = true
    error.value = null
    try {
      await $fetch('/api/me', { method: 'PATCH', body: { units: next } })
      await refreshNuxtData('profile')
    }
    catch (e) {
      units.value = previous
      error.value = errorMessage(e, 'Could not save the units preference.')
    }
    finally {
      saving.value = false
    }
  }

  return { units, saving, error, load, setUnits }
})
