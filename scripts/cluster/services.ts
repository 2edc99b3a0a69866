// The cluster's stand-ins for outside services, in one process: a fake S3 server (uploads, shared by every API
// process) and a fake SMTP server whose messages land in the mailbox table.
// Run: tsx scripts/cluster/services.ts (started and stopped by npm run cluster / cluster:stop).
import path from 'node:path';
import { createDb } from '../../server/db/client';
import { startFakeSmtp } from '../../server/lib/fake-smtp';
import { storeReceivedMail } from '../../server/features/mail/mailbox.service';
import { startFakeS3 } from './fake-s3';
import { BUCKET, CLUSTER_DIR, databaseUrl, PORTS, readState } from './layout';

const state = readState();
if (!state) throw new Error('No cluster state; start the cluster with npm run cluster.');
const s3 = await startFakeS3({ directory: path.join(CLUSTER_DIR, 's3'), port: PORTS.s3, buckets: [BUCKET] });
const { db, pool } = createDb(databaseUrl(state), { connectionLimit: 2 });
const smtp = await startFakeSmtp({ port: PORTS.smtp, host: '127.0.0.1', onMessage: (m) => storeReceivedMail(db, m) });
console.log(`fake S3 at ${s3.endpoint} (bucket ${BUCKET}), fake SMTP on port ${smtp.port}`);

const stop = () =>
  void Promise.allSettled([s3.stop(), smtp.stop()])
    .then(() => pool.end())
    .finally(() => process.exit(0));
process.once('SIGTERM', stop);
process.once('SIGINT', stop);
