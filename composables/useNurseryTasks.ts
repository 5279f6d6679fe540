import type { TaskState } from '#shared/schemas/nurseryTasks'
import type { NurseryTask, NurseryTaskList } from '#shared/types/nurseryTasks'
import { contractDate } from '#shared/utils/contractDisplay'

// The season calendar's reads: every task the filters keep (the route answers 200 a page), and
// the tasks grouped by the month they are due in.

const PAGE = 200
const MOST_PAGES = 20

/** What the calendar filters on; an empty string is no filter. */
export interface TaskFilterValues { state: TaskState, treeContractId: string }

export interface TaskMonth {
  /** YYYY-MM */
  month: string
  /** "September 2026" */
  label: string
  tasks: NurseryTask[]
}

/** Tasks in due order, grouped by the month each is due in. */
export function tasksByMonth(tasks: readonly NurseryTask[]): TaskMonth[] {
  const months: TaskMonth[] = []
  for (const task of tasks) {
    const month = task.due.slice(0, 7)
    let group = months.at(-1)
    if (group?.month !== month) {
      group = { month, label: contractDate(`${month}-01`).replace(/^1 /, ''), tasks: [] }
      months.push(group)
    }
    group.tasks.push(task)
  }
  return months
}

/** The nursery's tasks the filters keep, fetched again when they change. */
export function useNurseryTasks(filters: Ref<TaskFilterValues>) {
  const request = useRequestFetch()
  const query = computed(() => Object.fromEntries(Object.entries(filters.value).filter(([, v]) => v !== '')))
  const { data, pending, error } = useAsyncData('nursery-tasks', async () => {
    const items: NurseryTask[] = []
    let total = 0
    for (let page = 0; page < MOST_PAGES; page++) {
      const answer = await request<NurseryTaskList>('/api/nursery/tasks', { query: { ...query.value, limit: PAGE, offset: page * PAGE } })
      items.push(...answer.items)
      total = answer.total
      if (items.length >= total || answer.items.length === 0) break
    }
    return { items, total }
  }, { watch: [query] })
  return {
    tasks: computed(() => data.value?.items),
    months: computed(() => tasksByMonth(data.value?.items ?? [])),
    total: computed(() => data.value?.total ?? 0),
    pending,
    error,
  }
}

/** The key of one run's tasks, for the run's page to refresh when an event is recorded. */
export const runTasksKey = (id: number) => `nursery-run-tasks-${id}`

/** What is still to do on one run, in due order. */
export function useRunTasks(id: MaybeRefOrGetter<number>) {
  const { data, error } = useFetch<NurseryTaskList>('/api/nursery/tasks', {
    key: () => runTasksKey(toValue(id)),
    query: computed(() => ({ runId: toValue(id), state: 'open', limit: PAGE })),
  })
  return { tasks: computed(() => data.value?.items), error }
}
