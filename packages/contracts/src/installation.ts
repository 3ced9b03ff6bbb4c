import { z } from 'zod';

/** What every page may know of the installation before anyone signs in. */
export const installationSchema = z.object({
  /** The invented demo scenario is loaded: its accounts share a published password. */
  demo: z.boolean(),
});
export type Installation = z.infer<typeof installationSchema>;

/**
 * Told to signed-in users only: the records key was made inside the data directory, so whoever
 * can write there could change records and seal them again undetected (DESIGN §5.5).
 */
export const recordsKeyStateSchema = z.object({ insideDataDir: z.boolean() });
export type RecordsKeyState = z.infer<typeof recordsKeyStateSchema>;
