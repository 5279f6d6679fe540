// The processor's request bodies are form-encoded with bracketed keys
// (`line_items[0][price_data][currency]=gbp`): read them into nested objects, arrays where the key is a number.

export type FormValue = string | FormObject | FormValue[]
export interface FormObject { [key: string]: FormValue }

export function parseForm(body: string): FormObject {
  const root: FormObject = {}
  for (const [key, value] of new URLSearchParams(body)) {
    const parts = key.replace(/\]/g, '').split('[')
    let node: FormObject | FormValue[] = root
    parts.forEach((part, i) => {
      const last = i === parts.length - 1
      const slot = node as Record<string, FormValue>
      if (last) {
        slot[part] = value
        return
      }
      if (slot[part] === undefined) slot[part] = /^\d+$/.test(parts[i + 1]!) ? [] : {}
      node = slot[part] as FormObject | FormValue[]
    })
  }
  return root
}

/** A value at a path of the parsed form, as text; undefined when absent or not text. */
export function textAt(form: FormObject, path: string): string | undefined {
  let node: FormValue | undefined = form
  for (const part of path.replace(/\]/g, '').split('[')) {
    if (node === undefined || typeof node === 'string') return undefined
    node = (node as Record<string, FormValue>)[part]
  }
  return typeof node === 'string' ? node : undefined
}

/** The string values of a form object (metadata), ignoring anything nested. */
export function textMap(value: FormValue | undefined): Record<string, string> {
  if (!value || typeof value === 'string' || Array.isArray(value)) return {}
  return Object.fromEntries(Object.entries(value).filter((e): e is [string, string] => typeof e[1] === 'string'))
}
