// s3rver ships no types; this is the small part we use.
declare module "s3rver" {
  import type { AddressInfo } from "node:net";
  interface S3rverOptions {
    port?: number;
    address?: string;
    directory: string;
    silent?: boolean;
    configureBuckets?: Array<{ name: string; configs: string[] }>;
  }
  export default class S3rver {
    constructor(options: S3rverOptions);
    run(): Promise<AddressInfo>;
    close(): Promise<void>;
  }
}
