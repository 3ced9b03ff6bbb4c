import type { Installation, RecordsKeyState } from '@emberline/contracts/installation';
import type { AppContext } from '../../context';
import { demoUsers } from '../../demo/demo-scenario';
import { anyUserWithId } from '../users/users.repository';

export function createInstallationService(ctx: AppContext) {
  const demoIds = demoUsers.map((user) => user.id);
  return {
    /** A demo installation is one whose data directory holds the demo scenario's accounts. */
    describe(): Installation {
      return { demo: anyUserWithId(ctx.db, demoIds) };
    },

    recordsKey(): RecordsKeyState {
      return { insideDataDir: ctx.recordsKey.insideDataDir };
    },
  };
}
