import { z } from 'zod';

/** The owner's network setting: a checkbox, absent when unticked. */
export const webhookNetworkSchema = z.object({
  workspaceId: z.string().min(1),
  allowPrivate: z
    .enum(['on', 'true'], 'Tick the box or leave it empty.')
    .optional()
    .transform((v) => v !== undefined),
});
