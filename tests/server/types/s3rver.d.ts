// The part of s3rver's API the bucket tests use (the package ships no types).
declare module 's3rver' {
  export interface S3rverOptions {
    address?: string
    port?: number
    silent?: boolean
    /** Folder that holds the buckets. */
    directory: string
    configureBuckets?: { name: string }[]
    resetOnClose?: boolean
  }

  export default class S3rver {
    constructor(options: S3rverOptions)
    run: () => Promise<{ address: string, port: number }>
    close: () => Promise<void>
  }
}
