import type { Statement } from '#shared/types/delivery'
import type { StatementSeasonList } from '#shared/utils/statement'

/** The seasons the organisation has statements for, newest first. */
export function useStatementSeasons() {
  const { data, pending, error } = useFetch<StatementSeasonList>('/api/statements', { key: 'statement-seasons', query: { limit: 200 } })
  return { seasons: computed(() => data.value?.items), total: computed(() => data.value?.total ?? 0), pending, error }
}

/** One contract's season statement, and the link that downloads it as CSV. */
export function useSeasonStatement(contractId: MaybeRefOrGetter<number>, year: MaybeRefOrGetter<number>) {
  const query = computed(() => ({ contractId: toValue(contractId), season: toValue(year) }))
  const { data, pending, error } = useFetch<Statement>('/api/statements', { key: () => `statement-${toValue(contractId)}-${toValue(year)}`, query })
  const csvHref = computed(() => `/api/statements?contractId=${toValue(contractId)}&season=${toValue(year)}&format=csv`)
  return { statement: data, pending, error, csvHref }
}

/** One delivery's statement, and the link that downloads it as CSV. */
export function useDeliveryStatement(id: MaybeRefOrGetter<number>) {
  // A plain string: the typed-route inference of useFetch is too deep for this path.
  const path = (): string => `/api/deliveries/${toValue(id)}/statement`
  const { data, pending, error } = useFetch<Statement>(path, { key: () => `statement-delivery-${toValue(id)}` })
  const csvHref = computed(() => `${path()}?format=csv`)
  return { statement: data, pending, error, csvHref }
}

/** A statement's figures as they read on the page: money in its currency, kilograms and tonnes, °Brix. */
export function useStatementFormat(currency: MaybeRefOrGetter<string>) {
  const money = (minor: number) => formatContractMoney(minor, toValue(currency))
  return {
    money,
    /** A sugar adjustment with its sign: "+£78.54", "−£9.96". */
    signedMoney: (minor: number) => (minor < 0 ? `−${money(-minor)}` : minor > 0 ? `+${money(minor)}` : money(0)),
    /** A price per tonne, to the tenth of a penny when it carries one. */
    rate: (minor: number) => new Intl.NumberFormat('en-GB', { style: 'currency', currency: toValue(currency), maximumFractionDigits: Number.isInteger(minor) ? 2 : 3 }).format(minor / 100),
    kg: (kg: number | null) => (kg === null ? '—' : `${formatNumber(kg, 1)} kg`),
    tonnes: (t: number) => `${formatNumber(t, 3)} t`,
    brix: (brix: number) => `${new Intl.NumberFormat('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 2 }).format(brix)} °Brix`,
    signedBrix: (brix: number) => `${brix > 0 ? '+' : brix < 0 ? '−' : ''}${formatNumber(Math.abs(brix), 1)}`,
  }
}
