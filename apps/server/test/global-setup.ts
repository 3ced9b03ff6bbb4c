import fs from 'node:fs';
import { RESPONSE_LOG_DIR } from './response-log';

/** Each run starts with no validated routes: the coverage test counts only this run's checks. */
export default function setup(): void {
  fs.rmSync(RESPONSE_LOG_DIR, { recursive: true, force: true });
}
