import { S3Client } from '@aws-sdk/client-s3'

let client: S3Client | undefined

/** The file store (lab sheets) and its bucket, from S3_ENDPOINT, S3_BUCKET and the S3_* keys. */
export function useS3(): { client: S3Client, bucket: string } {
  client ??= new S3Client({
    endpoint: process.env.S3_ENDPOINT || 'http://127.0.0.1:4568',
    region: process.env.S3_REGION || 'us-east-1',
    credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID || 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY || 'S3RVER' },
    // Bucket in the path, not the host name, so any S3-compatible store (and the local one) works.
    forcePathStyle: true,
    // Checksums only where S3 demands them: other stores do not all accept the SDK's default ones.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
  return { client, bucket: process.env.S3_BUCKET || 'pomewright-files' }
}
