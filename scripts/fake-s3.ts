/**
 * The local fake S3 server (s3rver) that `STORAGE=s3` runs against in `npm start`, `npm run dev` and
 * `npm test`, so the S3 driver works with no hosted account; tests and the upload benchmark start it in
 * process. Run alone it serves until stopped: `tsx scripts/fake-s3.ts DIR PORT BUCKET`.
 */
import { mkdir } from 'node:fs/promises'
import { pathToFileURL } from 'node:url'
import S3rver from 's3rver'

export interface FakeS3 {
  /** what the S3 driver's settings need: STORAGE=s3 with these */
  env: { S3_ENDPOINT: string; S3_BUCKET: string; S3_REGION: string; S3_ACCESS_KEY_ID: string; S3_SECRET_ACCESS_KEY: string }
  stop: () => Promise<void>
}

/** s3rver on loopback with one bucket, keeping its objects (and the parts of unfinished uploads) under `dir`. */
export async function startFakeS3({ dir, port = 0, bucket = 'gridcue-recordings' }: { dir: string; port?: number; bucket?: string }): Promise<FakeS3> {
  await mkdir(dir, { recursive: true })
  const server = new S3rver({ address: '127.0.0.1', port, silent: true, directory: dir, configureBuckets: [{ name: bucket }] })
  const address = await server.run()
  return {
    // s3rver checks no signatures: any key pair will do, and these say where they belong
    env: { S3_ENDPOINT: `http://127.0.0.1:${address.port}`, S3_BUCKET: bucket, S3_REGION: 'us-east-1', S3_ACCESS_KEY_ID: 'S3RVER', S3_SECRET_ACCESS_KEY: 'S3RVER' },
    stop: () => server.close(),
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const [dir, port, bucket] = process.argv.slice(2)
  if (!dir || !port) {
    process.stderr.write('usage: tsx scripts/fake-s3.ts DIR PORT [BUCKET]\n')
    process.exit(2)
  }
  const fake = await startFakeS3({ dir, port: Number(port), bucket })
  process.stdout.write(`fake S3 (s3rver) at ${fake.env.S3_ENDPOINT}, bucket ${fake.env.S3_BUCKET}, objects in ${dir}\n`)
  const stop = () => void fake.stop().then(() => process.exit(0))
  process.on('SIGINT', stop)
  process.on('SIGTERM', stop)
}
