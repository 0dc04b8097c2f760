/** The S3-compatible object store: the local fake in development, any S3 service in production. */
import { S3Client } from '@aws-sdk/client-s3';
import { config } from './config';

let client: S3Client | undefined;

export function s3(): S3Client {
  const c = config();
  client ??= new S3Client({
    endpoint: c.S3_ENDPOINT,
    region: c.S3_REGION,
    forcePathStyle: c.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: c.S3_ACCESS_KEY_ID, secretAccessKey: c.S3_SECRET_ACCESS_KEY },
    // Presigned PUTs from browsers must not carry checksum headers the browser cannot compute.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  return client;
}

export const bucket = () => config().S3_BUCKET;
