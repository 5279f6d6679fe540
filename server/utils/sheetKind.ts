import { fileTypeFromBuffer } from 'file-type'
import { LAB_SHEET_NAME_ENDINGS, type LabSheetKind } from '#shared/schemas/labSheet'

// What a lab sheet is, judged by its bytes and not by its name: file-type reads a binary file's
// signature (an XLSX is a zip holding a workbook, which it tells apart from any other zip); a CSV
// has no signature, so it is taken as text when it is valid UTF-8 with no NUL bytes and has a
// delimiter or at least one line. The name's ending must then agree with what the bytes are.

export type SheetVerdict
  = | { ok: true, kind: LabSheetKind }
    | { ok: false, message: string }

function looksLikeText(bytes: Uint8Array): boolean {
  if (bytes.includes(0)) return false
  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes)
  }
  catch {
    return false
  }
  text = text.replace(/^\uFEFF/, '')
  return /[,;\t|]/.test(text) || /\S[^\r\n]*(\r?\n|$)/.test(text)
}

async function kindOfBytes(bytes: Uint8Array): Promise<{ kind?: LabSheetKind, what: string }> {
  const type = await fileTypeFromBuffer(bytes)
  if (type?.ext === 'pdf') return { kind: 'pdf', what: 'a PDF' }
  if (type?.ext === 'xlsx') return { kind: 'xlsx', what: 'an XLSX workbook' }
  if (type) return { what: `a ${type.ext.toUpperCase()} file` }
  if (looksLikeText(bytes)) return { kind: 'csv', what: 'a CSV' }
  return { what: 'not text, nor a file type we recognise' }
}

const ending = (name: string) => /\.([^.]+)$/.exec(name)?.[1]?.toLowerCase() ?? ''

/** The sheet's kind, or why it is refused, in words that name the file. */
export async function judgeSheet(name: string, bytes: Uint8Array): Promise<SheetVerdict> {
  if (!bytes.length) return { ok: false, message: `${name} is empty.` }
  const { kind, what } = await kindOfBytes(bytes)
  if (!kind) return { ok: false, message: `${name} is ${what}: a lab sheet must be a CSV, XLSX or PDF file.` }
  const named = (Object.keys(LAB_SHEET_NAME_ENDINGS) as LabSheetKind[]).find(k => LAB_SHEET_NAME_ENDINGS[k].includes(ending(name)))
  if (!named) return { ok: false, message: `${name} is not named as a CSV, XLSX or PDF file (it holds ${what}).` }
  if (named !== kind) return { ok: false, message: `${name} is named as ${named.toUpperCase()} but holds ${what}.` }
  return { ok: true, kind }
}
