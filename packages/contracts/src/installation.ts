import { z } from 'zod';

/** What every page may know of the installation before anyone signs in. */
export const installationSchema = z.object({
  /** The invented demo scenario is loaded: its accounts share a published password. */
  demo: z.boolean(),
});
export type Installation = z.infer<typeof installationSchema>;
