import { addDays } from '@emberline/domain/dates';
import type { Rule } from '@emberline/contracts/limits';
import { validateRuleZones, validateRules } from '@emberline/domain/rules';
import type { DbOrTx } from '../db/client';
import { appendAudit } from '../modules/audit/audit.repository';
import {
  insertLimitSet,
  insertRules,
  publishLimitSet,
} from '../modules/limit-sets/limit-sets.repository';
import { canonicalSha256 } from '../lib/canonical';
import { limitSetContent } from '../modules/limit-sets/limit-sets.service';
import { DEMO_MODEL_ID, demoModelRows } from './demo-fleet';

// Every limit here is INVENTED for the demo scenario. None is taken from, or resembles on purpose,
// any real engine manual; an approved manual's limits are transcribed by engineers in the limit library.

export const DEMO_LIMIT_SET_ID = 'limits-vt300-demo-r1';
export const DEMO_DRAFT_LIMIT_SET_ID = 'limits-vt300-demo-r2';
const MANUAL = 'VT-300 Demo Engine Manual 72-00-00 (invented)';

/** The rule fields a demo rule may leave out: no zone list means any zone, no limit means none. */
type Optional =
  | 'zones'
  | 'serviceableMax'
  | 'repeatMax'
  | 'repeatInterval'
  | 'beyondAction'
  | 'notPermitted'
  | 'maxPerAirfoil'
  | 'maxTotalPerAirfoil'
  | 'maxAirfoilsPerRow'
  | 'maxAdjacentAirfoils';

const base: Pick<Rule, Optional> = {
  zones: ['*'],
  serviceableMax: null,
  repeatMax: null,
  repeatInterval: null,
  beyondAction: null,
  notPermitted: false,
  maxPerAirfoil: null,
  maxTotalPerAirfoil: null,
  maxAirfoilsPerRow: null,
  maxAdjacentAirfoils: null,
};

type RuleDraft = Omit<Rule, Optional | 'reference' | 'title'> &
  Partial<Pick<Rule, Optional>> & { section: string };

/** The section's words after its figure or table number make the rule's title. */
const titleOf = (section: string) => {
  const words = section.slice(section.indexOf(', ') + 2);
  return words.charAt(0).toUpperCase() + words.slice(1);
};

const rule = (draft: RuleDraft): Rule => {
  const { section, ...rest } = draft;
  return { ...base, ...rest, title: titleOf(section), reference: `${MANUAL}, ${section}` };
};

const cycles = (value: number) => ({ cycles: value, hours: null, days: null });
const removeWithin = (value: number) => ({
  kind: 'remove-within' as const,
  cycles: value,
  hours: null,
});
const beforeNextFlight = { kind: 'remove-before-next-flight' as const, cycles: null, hours: null };
const atShopVisit = { kind: 'remove-at-next-shop-visit' as const, cycles: null, hours: null };

function vaneRules(row: string, chapter: string, hot: boolean): Rule[] {
  const scale = hot ? 1 : 1.6;
  return [
    rule({
      id: `${row}.crack.edges`,
      row,
      zones: ['leading-edge', 'trailing-edge'],
      damage: 'crack',
      measure: 'length',
      unit: 'mm',
      serviceableMax: 1.5 * scale,
      repeatMax: 4 * scale,
      repeatInterval: cycles(hot ? 400 : 800),
      beyondAction: removeWithin(hot ? 50 : 150),
      maxAdjacentAirfoils: 2,
      section: `${chapter} fig. 601, cracks at the vane edges`,
    }),
    rule({
      id: `${row}.crack.platforms`,
      row,
      zones: ['inner-platform', 'outer-platform'],
      damage: 'crack',
      measure: 'length',
      unit: 'mm',
      serviceableMax: 3 * scale,
      repeatMax: 8 * scale,
      repeatInterval: cycles(hot ? 500 : 1000),
      beyondAction: atShopVisit,
      section: `${chapter} fig. 602, platform cracks`,
    }),
    rule({
      id: `${row}.burn`,
      row,
      damage: 'burn',
      measure: 'area',
      unit: 'mm2',
      serviceableMax: 6 * scale,
      repeatMax: 20 * scale,
      repeatInterval: cycles(hot ? 250 : 500),
      beyondAction: removeWithin(25),
      section: `${chapter} table 603, burns and burn-through`,
    }),
    rule({
      id: `${row}.coating-loss`,
      row,
      damage: 'coating-loss',
      measure: 'area',
      unit: 'mm2',
      serviceableMax: 25 * scale,
      repeatMax: 80 * scale,
      repeatInterval: { cycles: hot ? 500 : 900, hours: null, days: 180 },
      beyondAction: atShopVisit,
      section: `${chapter} table 604, thermal barrier coating loss`,
    }),
    rule({
      id: `${row}.nick`,
      row,
      zones: ['leading-edge', 'trailing-edge'],
      damage: 'nick',
      measure: 'depth',
      unit: 'mm',
      serviceableMax: 0.4,
      repeatMax: 0.8,
      repeatInterval: cycles(600),
      beyondAction: atShopVisit,
      section: `${chapter} fig. 605, nicks at the edges`,
    }),
    rule({
      id: `${row}.blocked-cooling-holes`,
      row,
      zones: ['cooling-holes'],
      damage: 'blocked-cooling-holes',
      measure: 'count',
      unit: 'count',
      serviceableMax: 3,
      repeatMax: 6,
      repeatInterval: cycles(300),
      beyondAction: removeWithin(100),
      section: `${chapter} table 606, blocked cooling holes per vane`,
    }),
    rule({
      id: `${row}.missing-material`,
      row,
      damage: 'missing-material',
      measure: 'area',
      unit: 'mm2',
      notPermitted: true,
      beyondAction: beforeNextFlight,
      section: `${chapter} para. 607, missing material`,
    }),
  ];
}

function bladeRules(row: string, chapter: string, hot: boolean): Rule[] {
  return [
    rule({
      id: `${row}.crack.root`,
      row,
      zones: ['root-fillet', 'platform'],
      damage: 'crack',
      measure: 'length',
      unit: 'mm',
      notPermitted: true,
      beyondAction: beforeNextFlight,
      section: `${chapter} para. 611, cracks at the blade root (not permitted)`,
    }),
    rule({
      id: `${row}.crack.edges`,
      row,
      zones: ['leading-edge', 'trailing-edge'],
      damage: 'crack',
      measure: 'length',
      unit: 'mm',
      serviceableMax: hot ? 0.5 : 1,
      repeatMax: hot ? 1.5 : 2.5,
      repeatInterval: cycles(hot ? 200 : 400),
      beyondAction: removeWithin(hot ? 25 : 75),
      maxAirfoilsPerRow: 3,
      section: `${chapter} fig. 612, cracks at the blade edges`,
    }),
    rule({
      id: `${row}.crack.tip`,
      row,
      zones: ['tip'],
      damage: 'crack',
      measure: 'length',
      unit: 'in',
      serviceableMax: 0.03,
      repeatMax: 0.06,
      repeatInterval: { cycles: hot ? 300 : 600, hours: hot ? 450 : 900, days: null },
      beyondAction: removeWithin(hot ? 50 : 150),
      section: `${chapter} fig. 613, tip cracks (limits given in inches)`,
    }),
    rule({
      id: `${row}.burn`,
      row,
      damage: 'burn',
      measure: 'area',
      unit: 'mm2',
      serviceableMax: hot ? 2 : 4,
      repeatMax: hot ? 6 : 12,
      repeatInterval: cycles(hot ? 150 : 300),
      beyondAction: removeWithin(25),
      section: `${chapter} table 614, burns`,
    }),
    rule({
      id: `${row}.coating-loss`,
      row,
      damage: 'coating-loss',
      measure: 'area',
      unit: 'mm2',
      serviceableMax: hot ? 10 : 20,
      repeatMax: hot ? 30 : 60,
      repeatInterval: { cycles: hot ? 300 : 600, hours: null, days: 120 },
      beyondAction: atShopVisit,
      maxTotalPerAirfoil: hot ? 40 : 80,
      section: `${chapter} table 615, coating loss per blade`,
    }),
    rule({
      id: `${row}.nick`,
      row,
      zones: ['leading-edge', 'trailing-edge', 'tip'],
      damage: 'nick',
      measure: 'depth',
      unit: 'mm',
      serviceableMax: 0.25,
      repeatMax: 0.5,
      repeatInterval: cycles(400),
      beyondAction: atShopVisit,
      maxPerAirfoil: 2,
      section: `${chapter} fig. 616, nicks`,
    }),
    rule({
      id: `${row}.blocked-cooling-holes`,
      row,
      zones: ['cooling-holes'],
      damage: 'blocked-cooling-holes',
      measure: 'count',
      unit: 'count',
      serviceableMax: 2,
      repeatMax: 4,
      repeatInterval: cycles(250),
      beyondAction: removeWithin(100),
      section: `${chapter} table 617, blocked cooling holes per blade`,
    }),
    rule({
      id: `${row}.tip-curl`,
      row,
      zones: ['tip'],
      damage: 'tip-curl',
      measure: 'length',
      unit: 'mm',
      serviceableMax: 1.2,
      repeatMax: 2.5,
      repeatInterval: cycles(500),
      beyondAction: atShopVisit,
      section: `${chapter} fig. 618, tip curl`,
    }),
    rule({
      id: `${row}.missing-material`,
      row,
      damage: 'missing-material',
      measure: 'area',
      unit: 'mm2',
      notPermitted: true,
      beyondAction: beforeNextFlight,
      section: `${chapter} para. 619, missing material`,
    }),
  ];
}

/** The invented limits of every row of the demo model. */
export const demoRules: Rule[] = [
  rule({
    id: 'comb-liner.crack',
    row: 'comb-liner',
    damage: 'crack',
    measure: 'length',
    unit: 'mm',
    serviceableMax: 12,
    repeatMax: 30,
    repeatInterval: cycles(500),
    beyondAction: removeWithin(100),
    section: '5-1 fig. 501, liner cracks',
  }),
  rule({
    id: 'comb-liner.burn',
    row: 'comb-liner',
    damage: 'burn',
    measure: 'area',
    unit: 'mm2',
    serviceableMax: 60,
    repeatMax: 180,
    repeatInterval: { cycles: 400, hours: null, days: 90 },
    beyondAction: removeWithin(50),
    section: '5-1 table 502, liner burns',
  }),
  rule({
    id: 'comb-liner.missing-material',
    row: 'comb-liner',
    damage: 'missing-material',
    measure: 'area',
    unit: 'mm2',
    notPermitted: true,
    beyondAction: removeWithin(10),
    section: '5-1 para. 503, burn-through of the liner',
  }),
  rule({
    id: 'fuel-nozzles.deposit',
    row: 'fuel-nozzles',
    zones: ['tip', 'swirler'],
    damage: 'deposit',
    measure: 'count',
    unit: 'count',
    maxAirfoilsPerRow: 6,
    beyondAction: atShopVisit,
    section: '5-2 para. 511, carbon deposit on more than six nozzles',
  }),
  rule({
    id: 'fuel-nozzles.erosion',
    row: 'fuel-nozzles',
    zones: ['heat-shield'],
    damage: 'erosion',
    measure: 'length',
    unit: 'mm',
    serviceableMax: 2,
    repeatMax: 5,
    repeatInterval: cycles(600),
    beyondAction: atShopVisit,
    section: '5-2 fig. 512, heat-shield erosion',
  }),
  ...vaneRules('hpt1-ngv', '6-1', true),
  ...bladeRules('hpt1-blade', '6-2', true),
  ...vaneRules('lpt1-ngv', '7-1', false),
  ...bladeRules('lpt1-blade', '7-2', false),
  ...vaneRules('lpt2-ngv', '7-3', false),
  ...bladeRules('lpt2-blade', '7-4', false),
  ...vaneRules('lpt3-ngv', '7-5', false),
  ...bladeRules('lpt3-blade', '7-6', false),
];

export const demoLimitSet = {
  id: DEMO_LIMIT_SET_ID,
  modelId: DEMO_MODEL_ID,
  revision: 'D-1',
  title: 'Invented demo limits — not from any engine manual',
  manualReference: MANUAL,
  invented: true,
};

/** The demo revision, checked like any other and published by the demo engineer. */
export function loadDemoLimits(tx: DbOrTx, now: Date, effectiveDate: string): void {
  validateRules(demoRules, new Set(demoModelRows.map((row) => row.key)));
  validateRuleZones(demoRules, new Map(demoModelRows.map((row) => [row.key, row.zones])));
  insertLimitSet(tx, {
    ...demoLimitSet,
    status: 'draft',
    effectiveDate,
    createdBy: 'user-engineer',
    createdAt: now,
  });
  insertRules(tx, DEMO_LIMIT_SET_ID, demoRules);
  publishLimitSet(tx, DEMO_LIMIT_SET_ID, DEMO_MODEL_ID, {
    at: now,
    by: 'user-engineer',
    contentSha256: canonicalSha256(limitSetContent({ ...demoLimitSet, effectiveDate }, demoRules)),
  });
  // A draft of the next revision with a tighter blade-edge crack limit, so that the impact preview
  // has demo findings to show (the growing crack on VT3-D0103 would no longer be in repeat).
  insertLimitSet(tx, {
    id: DEMO_DRAFT_LIMIT_SET_ID,
    modelId: DEMO_MODEL_ID,
    revision: 'D-2',
    title: 'Invented demo limits, draft: tighter blade-edge cracks',
    manualReference: 'VT-300 Demo Engine Manual 72-00-00 (invented), draft of revision 2',
    invented: true,
    status: 'draft',
    // A month after the demo is loaded; the draft still waits for its independent check.
    effectiveDate: addDays(now.toISOString().slice(0, 10), 30),
    basedOnId: DEMO_LIMIT_SET_ID,
    createdBy: 'user-engineer',
    createdAt: now,
  });
  insertRules(
    tx,
    DEMO_DRAFT_LIMIT_SET_ID,
    demoRules.map((rule) =>
      rule.id === 'hpt1-blade.crack.edges' ? { ...rule, repeatMax: 1.2 } : rule,
    ),
  );
  appendAudit(tx, now, {
    actorUserId: null,
    action: 'demo.limit-set-published',
    entityType: 'limit-set',
    entityId: DEMO_LIMIT_SET_ID,
    after: { revision: demoLimitSet.revision, rules: demoRules.length, invented: true },
  });
}
