// s3rver (a local S3 fake for tests) ships no types; the little the tests use.
declare module 's3rver' {
  interface S3rverOptions {
    address?: string
    port?: number
    silent?: boolean
    directory: string
    resetOnClose?: boolean
    configureBuckets?: { name: string, configs?: unknown[] }[]
  }
  export default class S3rver {
    constructor(options: S3rverOptions)
    run(): Promise<{ address: string, port: number }>
    close(): Promise<void>
  }
}
