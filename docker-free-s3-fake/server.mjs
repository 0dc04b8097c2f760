// A local S3-compatible store for development and tests: s3rver with our bucket created and
// CORS open to the app's origins, keeping its objects in the project's data folder.
// Usage: node docker-free-s3-fake/server.mjs  (env: S3_FAKE_PORT, S3_FAKE_DIR, S3_BUCKET, S3_CORS_ORIGINS)
import fs from 'node:fs';
import S3rver from 's3rver';

const port = Number(process.env.S3_FAKE_PORT ?? 4569);
const directory = process.env.S3_FAKE_DIR ?? '.data/s3';
const bucket = process.env.S3_BUCKET ?? 'torquetrail';
const origins = (process.env.S3_CORS_ORIGINS ?? 'http://127.0.0.1:4321,http://localhost:4321').split(',').map((o) => o.trim()).filter(Boolean);

const rule = (origin) => `<CORSRule>
    <AllowedOrigin>${origin}</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod><AllowedMethod>PUT</AllowedMethod><AllowedMethod>HEAD</AllowedMethod><AllowedMethod>POST</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>`;
const cors = `<CORSConfiguration>${origins.map(rule).join('')}</CORSConfiguration>`;

fs.mkdirSync(directory, { recursive: true });
const server = new S3rver({
  port,
  address: '127.0.0.1',
  silent: true,
  directory,
  configureBuckets: [{ name: bucket, configs: [cors] }],
});
await server.run();
console.log(`S3 fake listening on http://127.0.0.1:${port}, bucket "${bucket}", data in ${directory}`);

const stop = async () => {
  await server.close();
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
