import { createHash, randomUUID } from 'node:crypto'
import { createReadStream, createWriteStream, renameSync } from 'node:fs'
import { join } from 'node:path'
import type { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { DeleteObjectsCommand, GetObjectCommand, HeadBucketCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { storageEnv, type Profile } from './profile'

export interface Storage { client: S3Client, bucket: string, endpoint: string }

export interface StoredObject { key: string, size: number, sha256: string, contentType?: string }

export function openStorage(p: Profile): Storage {
  const env = storageEnv(p)
  const client = new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    // Path-style addresses and no extra checksums: what s3rver (and most S3-compatible stores) accept.
    forcePathStyle: true,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
  return { client, bucket: env.S3_BUCKET, endpoint: env.S3_ENDPOINT }
}

/** Throws a message a person can act on when the bucket does not answer. */
export async function requireBucket(s: Storage, notRunning: string): Promise<void> {
  try {
    await s.client.send(new HeadBucketCommand({ Bucket: s.bucket }))
  }
  catch (error) {
    const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode
    if (status === 404) throw new Error(`The file storage at ${s.endpoint} has no bucket "${s.bucket}".`)
    throw new Error(`${notRunning} (the file storage at ${s.endpoint} does not answer: ${(error as Error).message})`)
  }
}

/** Every object in the bucket, by key, with its size. */
export async function listObjects(s: Storage): Promise<{ key: string, size: number }[]> {
  const objects: { key: string, size: number }[] = []
  let token: string | undefined
  do {
    const page = await s.client.send(new ListObjectsV2Command({ Bucket: s.bucket, ContinuationToken: token }))
    for (const object of page.Contents ?? []) objects.push({ key: object.Key!, size: object.Size ?? 0 })
    token = page.IsTruncated ? page.NextContinuationToken : undefined
  } while (token)
  return objects
}

/**
 * Downloads one object into `dir`, named by the SHA-256 of its bytes: keys may hold slashes, `..`
 * or more than a file name's 255 bytes, a digest never does.
 */
export async function downloadObject(s: Storage, key: string, dir: string): Promise<StoredObject> {
  const res = await s.client.send(new GetObjectCommand({ Bucket: s.bucket, Key: key }))
  const hash = createHash('sha256')
  let size = 0
  const partial = join(dir, `.${randomUUID()}`)
  await pipeline(res.Body as Readable, async function* (chunks: AsyncIterable<Buffer>) {
    for await (const chunk of chunks) {
      hash.update(chunk)
      size += chunk.length
      yield chunk
    }
  }, createWriteStream(partial))
  const sha256 = hash.digest('hex')
  renameSync(partial, join(dir, sha256))
  return { key, size, sha256, contentType: res.ContentType }
}

export async function uploadObject(s: Storage, object: StoredObject, path: string): Promise<void> {
  await s.client.send(new PutObjectCommand({
    Bucket: s.bucket, Key: object.key, Body: createReadStream(path), ContentLength: object.size, ContentType: object.contentType,
  }))
}

export async function emptyBucket(s: Storage): Promise<void> {
  const keys = (await listObjects(s)).map(o => ({ Key: o.key }))
  // DeleteObjects takes up to 1000 keys a call.
  for (let i = 0; i < keys.length; i += 1000) {
    const res = await s.client.send(new DeleteObjectsCommand({ Bucket: s.bucket, Delete: { Objects: keys.slice(i, i + 1000), Quiet: true } }))
    if (res.Errors?.length) throw new Error(`Could not delete ${res.Errors.length} object(s) from ${s.bucket}, e.g. "${res.Errors[0]!.Key}": ${res.Errors[0]!.Message}`)
  }
}
