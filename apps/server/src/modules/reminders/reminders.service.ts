import { permissionGrants } from '@emberline/contracts/permissions';
import type { PlanningItem } from '@emberline/contracts/planning';
import { addDays, dayWords } from '@emberline/domain/dates';
import { removalKindWords } from '@emberline/domain/decision-words';
import { dueWords } from '@emberline/domain/due-status';
import type { AppContext } from '../../context';
import { inTransaction, type DbOrTx } from '../../db/client';
import { queueMail } from '../../lib/email/outbox';
import { publicOrigin } from '../auth/auth.service';
import { refreshDue } from '../planning/due-basis';
import {
  becameOverdueEmail,
  dailyDigestEmail,
  type ReminderLine,
} from '../planning/planning-emails';
import { createPlanningService, todayIn } from '../planning/planning.service';
import { listActiveHomeUsers } from '../users/users.repository';
import { lastRunDay, markRun } from './reminders.repository';

/** The hour of the day of an instant in a time zone (0-23). */
export function hourIn(timeZone: string, now: Date): number {
  return Number(
    new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', hourCycle: 'h23' }).format(now),
  );
}

const bookingWords = (item: PlanningItem) =>
  item.booking
    ? `booked for ${dayWords(item.booking.plannedDate)}${item.booking.afterDueDate ? ', after the due date' : ''}`
    : 'not booked';

const lineOf = (item: PlanningItem, words: string): ReminderLine => ({
  serialNumber: item.serialNumber,
  organisationName: item.organisationName,
  words,
});

/**
 * The planners' reminders (DESIGN §5.6), run by the scheduler and driven by the app's clock:
 * once a day, every engine that became overdue since the last check gets its own e-mail, and
 * at the configured hour the planners get one digest. Each job's last day is kept in SQLite in
 * the transaction that queues its mail, so a restart neither repeats a day nor, when it comes
 * after the hour, misses one.
 */
export function createReminders(ctx: AppContext) {
  const { db, config, logger } = ctx;
  const planning = createPlanningService(ctx);
  const origin = () => publicOrigin(config.publicOrigins, config.port);
  const planners = (tx: DbOrTx) =>
    listActiveHomeUsers(tx, permissionGrants['plan:inspection']).map((user) => user.email);

  /** Runs a job once for a day, in one transaction with its record of having run. */
  function once(job: string, day: string, work: (tx: DbOrTx, lastDay: string | null) => void) {
    return inTransaction(db, (tx) => {
      const lastDay = lastRunDay(tx, job);
      if (lastDay !== null && lastDay >= day) return false;
      work(tx, lastDay);
      markRun(tx, job, day, ctx.now());
      return true;
    });
  }

  /** Engines overdue today that were not on the last day checked: one e-mail each. */
  function overdueCheck(tx: DbOrTx, day: string, lastDay: string | null): number {
    // The daily check also recomputes every due basis from the records: a move found here was
    // missed by the change that caused it, and is kept and logged.
    const missed = refreshDue(ctx, tx, {}, 'Recomputed by the daily check of the records.');
    if (missed.length)
      logger.warn(
        { engines: missed.map((item) => item.serialNumber) },
        'the daily check found due dates that moved without a recorded cause',
      );
    const before = new Map(
      planning.fleetOn(lastDay ?? addDays(day, -1)).map((item) => [item.engineId, item.state]),
    );
    const became = planning
      .fleetOn(day)
      .filter((item) => item.state === 'overdue' && before.get(item.engineId) !== 'overdue');
    const to = planners(tx);
    if (to.length === 0) return 0;
    for (const item of became)
      queueMail(ctx, tx, {
        kind: 'reminder',
        ...becameOverdueEmail({
          to,
          line: lineOf(item, `${item.reason} It is ${bookingWords(item)}.`),
          link: `${origin()}/engines/${item.engineId}`,
        }),
        record: { type: 'engine', id: item.engineId, label: `Engine ${item.serialNumber}` },
      });
    return became.length;
  }

  function digest(tx: DbOrTx, day: string): void {
    const to = planners(tx);
    if (to.length === 0) return;
    const fleet = planning.fleetOn(day);
    const soon = addDays(day, config.dueSoon.days);
    const pressing = fleet.filter((item) => item.state === 'overdue' || item.state === 'due-soon');
    queueMail(ctx, tx, {
      kind: 'reminder',
      ...dailyDigestEmail({
        to,
        day,
        sections: [
          {
            title: 'Overdue',
            lines: fleet
              .filter((item) => item.state === 'overdue')
              .map((item) => lineOf(item, `${item.reason} ${bookingWords(item)}.`)),
          },
          {
            title: `Due within ${config.dueSoon.days} days`,
            lines: fleet
              .filter(
                (item) =>
                  item.state === 'due-soon' ||
                  (item.state !== 'overdue' &&
                    item.nextInspection?.dueDate != null &&
                    item.nextInspection.dueDate <= soon),
              )
              .map((item) =>
                lineOf(item, `due ${dueWords(item.nextInspection)}, ${bookingWords(item)}.`),
              ),
          },
          {
            title: 'Removals',
            lines: fleet
              .filter((item) => item.removal && item.state !== 'in-shop')
              .map((item) =>
                lineOf(
                  item,
                  `${removalKindWords[item.removal!.kind]}${item.removal!.dueDate ? `, due ${dueWords(item.removal)}` : ''}.`,
                ),
              ),
          },
          {
            title: 'Overdue or due soon, not booked',
            lines: pressing
              .filter((item) => !item.booking)
              .map((item) => lineOf(item, `due ${dueWords(item.nextInspection)}.`)),
          },
        ],
        link: `${origin()}/planning`,
      }),
      record: { type: 'planning', id: day, label: `Planning digest of ${dayWords(day)}` },
    });
  }

  return {
    /**
     * What the scheduler runs every few minutes and once at start: the overdue check on the first
     * tick of a day, the digest on the first tick at or after the configured hour.
     */
    tick(): { overdueEmails: number | null; digest: boolean } {
      const now = ctx.now();
      const day = todayIn(config.timeZone, now);
      let overdueEmails: number | null = null;
      once('overdue-check', day, (tx, lastDay) => {
        overdueEmails = overdueCheck(tx, day, lastDay);
      });
      const digestSent =
        hourIn(config.timeZone, now) >= config.reminderHour &&
        once('daily-digest', day, (tx) => digest(tx, day));
      return { overdueEmails, digest: digestSent };
    },
  };
}
