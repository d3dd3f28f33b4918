'use server';
// Server actions of the job forms: create and edit. Each validates again with the shared
// schema (the form already did), writes the job with its history row, and on success goes to
// the job's page.
import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { createJob, updateJob } from '@/db/queries/jobs';
import { requireAction } from '@/lib/auth/require-role';
import { isAppError } from '@/lib/errors';
import type { ActionState } from '@/lib/http/action-state';
import { formDataToObject, parseOrThrow } from '@/lib/validation/form';
import { parseId } from '@/lib/validation/ids';
import { jobCreateSchema, jobUpdateSchema } from '@/lib/validation/jobs';

async function saveJob(body: () => Promise<number>): Promise<ActionState> {
  let jobId: number;
  try {
    jobId = await body();
  } catch (error) {
    if (isAppError(error)) return { status: 'error', message: error.message, fields: error.fields, at: Date.now() };
    console.error('[kerfcast] unexpected error in a job form action', error);
    return { status: 'error', message: 'Something went wrong on the server. Try again.', at: Date.now() };
  }
  revalidatePath('/jobs');
  // outside the try: redirect() works by throwing
  redirect(`/jobs/${jobId}`);
}

export async function createJobAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return saveJob(async () => {
    const user = await requireAction('jobs:write');
    const input = parseOrThrow(jobCreateSchema, formDataToObject(form), 'job');
    return (await createJob(user.shopId, user.id, input)).id;
  });
}

export async function updateJobAction(_previous: ActionState, form: FormData): Promise<ActionState> {
  return saveJob(async () => {
    const user = await requireAction('jobs:write');
    const jobId = parseId(String(form.get('jobId') ?? ''), 'job');
    const values = formDataToObject(form);
    delete values.jobId;
    const input = parseOrThrow(jobUpdateSchema, values, 'job');
    return (await updateJob(user.shopId, user.id, jobId, input)).id;
  });
}
