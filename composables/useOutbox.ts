import type { OutboxList } from '#shared/types/notice'
import type { MessageState } from '#shared/utils/messageStatus'

/** One page of the e-mail sent in the organisation's name (owners only), optionally of one state. */
export function useOrganisationOutbox(status: Ref<MessageState | ''>, offset: Ref<number>, limit = 20) {
  const query = computed(() => ({ limit, offset: offset.value, ...(status.value ? { status: status.value } : {}) }))
  const { items: messages, ...rest } = usePagedList<OutboxList['items'][number]>('/api/organisation/outbox', query, 'organisation-outbox')
  return { messages, limit, ...rest }
}
