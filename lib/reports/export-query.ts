// The estimates export's URL filters (the runs export takes the runs list's, lib/validation/runs.ts).
import { z } from '@/lib/validation/zod';

const queryId = (what: string) =>
  z.coerce.number({ error: `Choose a ${what}.` }).int(`Choose a ${what}.`).positive(`Choose a ${what}.`).max(2_147_483_647, `Choose a ${what}.`);

export const estimateExportQuerySchema = z.object({
  machineId: queryId('machine').optional(),
  jobId: queryId('job').optional(),
});

export type EstimateExportQuery = z.infer<typeof estimateExportQuerySchema>;
