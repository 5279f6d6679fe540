import type { OrganisationPatchInput } from '#shared/schemas/organisation'
import type { OrganisationSettings } from '#shared/types/organisation'

/**
 * The signed-in person's organisation settings, and saving a change (owners only; the server
 * checks). A refusal is thrown for the form to show beside its fields; the home page's copy of the
 * name and region is read again after a save.
 */
export function useOrganisationSettings() {
  const { data: settings, pending, error, refresh } = useFetch<OrganisationSettings>('/api/organisation', { key: 'organisation-settings' })
  const saving = ref(false)

  async function save(body: OrganisationPatchInput): Promise<OrganisationSettings> {
    saving.value = true
    try {
      const saved = await $fetch<OrganisationSettings>('/api/organisation', { method: 'PATCH', body })
      settings.value = saved
      await refreshNuxtData(['profile', 'directory'])
      return saved
    }
    finally {
      saving.value = false
    }
  }

  return { settings, pending, error, refresh, save, saving }
}
