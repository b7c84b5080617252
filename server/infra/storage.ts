import { CreateBucketCommand, GetObjectCommand, HeadBucketCommand, PutObjectCommand, DeleteObjectCommand, S3Client } from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import type { Config } from '../config';

/** Files (drawings, generated PDFs) in an S3-compatible object store, only through the S3 SDK. */
export function createStorage(s3: Config['s3']) {
  // The project runs on Node 20 and pins an SDK version that supports it; the SDK's notice about
  // its future releases would otherwise print at every start of every process.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  const client = new S3Client({
    region: s3.region,
    endpoint: s3.endpoint,
    forcePathStyle: s3.forcePathStyle,
    credentials: s3.accessKeyId && s3.secretAccessKey ? { accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey } : undefined,
    // The local fake predates the SDK's default request checksums; send them only when required.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 2,
  });
  const Bucket = s3.bucket;

  return {
    bucket: Bucket,
    client,
    /** Creates the bucket when it does not exist yet (local runs; harmless against a real store). */
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
      } catch {
        await client.send(new CreateBucketCommand({ Bucket }));
      }
    },
    async check() {
      await client.send(new HeadBucketCommand({ Bucket }), { abortSignal: AbortSignal.timeout(3_000) });
    },
    async put(key: string, body: Buffer, contentType: string, metadata?: Record<string, string>) {
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType, Metadata: metadata }));
    },
    async get(key: string): Promise<{ body: Readable; contentType?: string; size?: number }> {
      const r = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      return { body: r.Body as Readable, contentType: r.ContentType, size: r.ContentLength };
    },
    async getBuffer(key: string): Promise<Buffer> {
      const r = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      return Buffer.from(await r.Body!.transformToByteArray());
    },
    async remove(key: string) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
  };
}
export type Storage = ReturnType<typeof createStorage>;
