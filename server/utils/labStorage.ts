import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3'
import { getSignedUrl } from '@aws-sdk/s3-request-presigner'
import { isDependencyDown } from './dependencies'
import { useS3 } from './s3'

// Lab sheets' files in the S3-compatible store, kept exactly as uploaded. Keyed by organisation
// and sha-256, so the same bytes in one organisation are one object.

/** How long a download link works. */
export const DOWNLOAD_LINK_SECONDS = 5 * 60

export const labSheetKey = (orgId: number, sha256: string) => `lab-sheets/${orgId}/${sha256}`

/** An outage of the store as a 503 a person can act on, a refusal by it as a 502; anything else as it came. */
function storageError(error: unknown, doing: string): unknown {
  const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode
  if (!isDependencyDown(error) && !(status && status >= 500)) {
    if (!status) return error
    return createError({ statusCode: 502, message: `File storage refused the request (${(error as Error).name}), so the sheet could not be ${doing}.`, cause: error })
  }
  return createError({
    statusCode: 503,
    statusMessage: 'Service Unavailable',
    // No cause kept: the API's error handler would answer a down service's cause in general words.
    message: `File storage is not answering, so the sheet could not be ${doing}. Nothing was kept; try again in a minute.`,
  })
}

export async function putSheetObject(key: string, bytes: Uint8Array, contentType: string, sha256: string): Promise<void> {
  const { client, bucket } = useS3()
  try {
    await client.send(new PutObjectCommand({
      Bucket: bucket, Key: key, Body: bytes, ContentType: contentType, ContentLength: bytes.length, Metadata: { sha256 },
    }))
  }
  catch (error) {
    throw storageError(error, 'stored')
  }
}

export async function sheetObjectBytes(key: string): Promise<Uint8Array> {
  const { client, bucket } = useS3()
  try {
    const answer = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }))
    return await answer.Body!.transformToByteArray()
  }
  catch (error) {
    throw storageError(error, 'read')
  }
}

export async function deleteSheetObject(key: string): Promise<void> {
  const { client, bucket } = useS3()
  await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }))
}

/** A link that downloads the file, under its uploaded name, for DOWNLOAD_LINK_SECONDS. */
export function presignSheetDownload(key: string, name: string, contentType: string): Promise<string> {
  const { client, bucket } = useS3()
  const fileName = name.replace(/["\\\r\n]/g, '_')
  return getSignedUrl(client, new GetObjectCommand({
    Bucket: bucket,
    Key: key,
    ResponseContentType: contentType,
    ResponseContentDisposition: `attachment; filename="${fileName.replace(/[^\x20-\x7E]/g, '_')}"; filename*=UTF-8''${encodeURIComponent(fileName)}`,
  }), { expiresIn: DOWNLOAD_LINK_SECONDS })
}
