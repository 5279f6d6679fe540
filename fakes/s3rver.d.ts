// s3rver ships no types; this is the part the local fake uses.
declare module 's3rver' {
  interface S3rverOptions {
    port?: number
    address?: string
    directory: string
    silent?: boolean
    configureBuckets?: { name: string, configs: string[] }[]
  }
  export default class S3rver {
    constructor(options: S3rverOptions)
    run(): Promise<{ address: string, port: number }>
    close(): Promise<void>
  }
}
