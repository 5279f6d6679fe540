import type { H3Event } from 'h3'

// A multipart/form-data body read as it arrives, with limits: the whole request by its
// Content-Length before any of it is read, and each part as it grows, so a file past its limit is
// refused at that point rather than after the whole body is held in memory. h3's own reader takes
// the whole body first, which is why uploads are read here.

export interface UploadPart {
  /** The form field's name. */
  field: string
  /** The file's name as sent, when the part is a file. */
  filename?: string
  type?: string
  data: Buffer
}

export interface UploadLimits {
  /** The most bytes the whole request may have. */
  requestBytes: number
  /** The most bytes one file may have. */
  partBytes: number
  /** The most file parts. */
  parts: number
  /** Says, in words, which file is too big. */
  tooBig: (filename: string) => string
}

const HEADER_BYTES = 16 * 1024
const FIELD_BYTES = 64 * 1024

function boundaryOf(contentType: string | undefined): string {
  const match = /^multipart\/form-data\s*;.*?boundary=(?:"([^"]+)"|([^;\s]+))/i.exec(contentType ?? '')
  const boundary = match?.[1] ?? match?.[2]
  if (!boundary) throw createError({ statusCode: 415, message: 'Send the files as multipart/form-data.' })
  return boundary
}

function partHeaders(block: string): { field: string, filename?: string, type?: string } {
  const headers = new Map<string, string>()
  for (const line of block.split('\r\n')) {
    const colon = line.indexOf(':')
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim())
  }
  const disposition = headers.get('content-disposition') ?? ''
  const field = /\bname="([^"]*)"/i.exec(disposition)?.[1]
  if (field === undefined) throw createError({ statusCode: 400, message: 'A part of the upload has no field name.' })
  const filename = /\bfilename="([^"]*)"/i.exec(disposition)?.[1]
  return { field, filename, type: headers.get('content-type') }
}

const tooLarge = (message: string) => createError({ statusCode: 413, statusMessage: 'Payload Too Large', message })

/** The parts of the request's multipart body, refusing (413) as soon as a limit is passed. */
export function readUploadParts(event: H3Event, limits: UploadLimits): Promise<UploadPart[]> {
  const req = event.node.req
  const boundary = boundaryOf(req.headers['content-type'])
  const length = Number(req.headers['content-length'])
  if (!Number.isFinite(length) || length <= 0) {
    return Promise.reject(createError({ statusCode: 411, message: 'Send the upload with its Content-Length.' }))
  }
  if (length > limits.requestBytes) {
    return Promise.reject(tooLarge(`An upload may carry at most ${limits.parts} files of ${limits.partBytes / 1024 / 1024} MiB each.`))
  }

  const opening = Buffer.from(`--${boundary}`)
  const delimiter = Buffer.from(`\r\n--${boundary}`)
  const parts: UploadPart[] = []
  let phase: 'preamble' | 'after-boundary' | 'headers' | 'body' | 'done' = 'preamble'
  let pending: Buffer = Buffer.alloc(0)
  let current: { field: string, filename?: string, type?: string, chunks: Buffer[], size: number } | undefined
  let received = 0

  // Moves through as much of what has arrived as can be told apart; false when it needs more.
  function step(): boolean {
    switch (phase) {
      case 'preamble': {
        const at = pending.indexOf(opening)
        if (at < 0) return false
        pending = pending.subarray(at + opening.length)
        phase = 'after-boundary'
        return true
      }
      case 'after-boundary': {
        if (pending.length < 2) return false
        const next = pending.subarray(0, 2).toString('latin1')
        if (next === '--') phase = 'done'
        else if (next === '\r\n') phase = 'headers'
        else throw createError({ statusCode: 400, message: 'The multipart body is malformed.' })
        pending = pending.subarray(2)
        return true
      }
      case 'headers': {
        const end = pending.indexOf('\r\n\r\n')
        if (end < 0) {
          if (pending.length > HEADER_BYTES) throw createError({ statusCode: 400, message: 'A part of the upload has headers too long.' })
          return false
        }
        const headers = partHeaders(pending.subarray(0, end).toString('utf8'))
        if (headers.filename !== undefined && parts.filter(p => p.filename !== undefined).length >= limits.parts) {
          throw tooLarge(`An upload may carry at most ${limits.parts} files.`)
        }
        current = { ...headers, chunks: [], size: 0 }
        pending = pending.subarray(end + 4)
        phase = 'body'
        return true
      }
      case 'body': {
        const at = pending.indexOf(delimiter)
        const take = at >= 0 ? at : Math.max(0, pending.length - delimiter.length + 1)
        if (take > 0) {
          current!.chunks.push(pending.subarray(0, take))
          current!.size += take
          const limit = current!.filename === undefined ? FIELD_BYTES : limits.partBytes
          if (current!.size > limit) throw tooLarge(limits.tooBig(current!.filename ?? current!.field))
        }
        if (at < 0) {
          pending = pending.subarray(take)
          return false
        }
        const { chunks, ...part } = current!
        parts.push({ field: part.field, filename: part.filename, type: part.type, data: Buffer.concat(chunks) })
        current = undefined
        pending = pending.subarray(at + delimiter.length)
        phase = 'after-boundary'
        return true
      }
      case 'done':
        pending = Buffer.alloc(0)
        return false
    }
  }

  return new Promise((resolve, reject) => {
    const stop = (error: unknown) => {
      req.off('data', onData)
      req.off('end', onEnd)
      // The rest of the body is let through unread, so the refusal reaches the sender.
      req.resume()
      reject(error)
    }
    const onData = (chunk: Buffer) => {
      received += chunk.length
      if (received > limits.requestBytes) return stop(tooLarge('The upload is larger than its Content-Length said.'))
      pending = pending.length ? Buffer.concat([pending, chunk]) : chunk
      try {
        while (step());
      }
      catch (error) {
        stop(error)
      }
    }
    const onEnd = () => {
      req.off('data', onData)
      if (phase !== 'done') return reject(createError({ statusCode: 400, message: 'The multipart body ended before its closing boundary.' }))
      resolve(parts)
    }
    req.on('data', onData)
    req.once('end', onEnd)
    req.once('error', reject)
  })
}
