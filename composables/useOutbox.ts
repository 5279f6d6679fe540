import type { OutboxList } from '#shared/types/notice'
import type { MessageState } from '#shared/utils/messageStatus'

/** One page of the e-mail sent in the organisation's name (owners only), optionally of one state. */
export function useOrganisationOutbox(status: Ref<MessageState | ''>, offset: Ref<number>, limit = 20) {
  const query = computed(() => ({ limit, offset: offset.value, ...(status.value ? { status: status.value } : {}) }))
  const { data, pending, error, refresh } = useFetch<OutboxList>('/api/organisation/outbox', { key: 'organisation-outbox', query })
  return {
    messages: computed(() => data.value?.items),
    total: computed(() => data.value?.total ?? 0),
    limit,
    pending,
    error,
    refresh,
  }
}
