// A background job's state and progress, for the screens that follow one.
import { eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { backgroundJobs } from '../../db/schema';
import { notFound } from '../../lib/http-error';
import { toJobDto } from '../../lib/jobs/runner';
import type { JobDto } from '../../../shared/schemas/jobs';

export async function getJob(db: Db, id: number): Promise<JobDto> {
  const [j] = await db.select().from(backgroundJobs).where(eq(backgroundJobs.id, id));
  if (!j) throw notFound('No such job.');
  return toJobDto(j);
}
