// Input of POST /api/programs/[programId]/estimates: the machine to estimate on and, when not
// the latest, the program version.
import { z } from '@/lib/validation/zod';

export const estimateRequestSchema = z.strictObject({
  machineId: z
    .number({ error: 'Choose the machine to estimate on (its id).' })
    .int('A machine id is a whole number.')
    .positive('A machine id is a whole number from 1.')
    .max(2_147_483_647, 'No such machine id.'),
  version: z.number({ error: 'The program version must be a whole number.' }).int('The program version must be a whole number.').positive('Program versions start at 1.').max(2_147_483_647).optional(),
});

export type EstimateRequestInput = z.infer<typeof estimateRequestSchema>;
