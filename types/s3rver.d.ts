// s3rver ships no types: the part of its API the fake S3 server in scripts/fake-s3.ts uses
declare module 's3rver' {
  import type { AddressInfo } from 'node:net'

  interface S3rverOptions {
    address?: string
    /** 0 for any free port */
    port?: number
    silent?: boolean
    /** where buckets and objects are kept */
    directory?: string
    configureBuckets?: { name: string; configs?: (string | Buffer)[] }[]
    resetOnClose?: boolean
  }

  export default class S3rver {
    constructor(options?: S3rverOptions)
    run(): Promise<AddressInfo>
    close(): Promise<void>
  }
}
