import S3rver from 's3rver'

// A local S3-compatible store for development and tests. It checks no signatures.
export async function startS3(port: number, directory: string, bucket: string): Promise<S3rver> {
  const server = new S3rver({ port, address: '127.0.0.1', directory, silent: true, configureBuckets: [{ name: bucket, configs: [] }] })
  await server.run()
  return server
}
