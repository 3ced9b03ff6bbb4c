/**
 * The cautions Emberline shows wherever limits, intervals, dispositions and reports are entered or
 * shown. Reports carry the same words.
 */
export const cautions = {
  short:
    'Emberline records and checks; it does not approve. Limits must come from the current approved engine manual; dispositions are made by authorised certifying staff under their approved procedures and local regulations.',
  limits:
    'Damage limits must be transcribed from the current approved engine manual revision. The demo limits are invented and must never be used on an engine.',
  dispositions:
    'Dispositions are made by authorised certifying staff under their organisation’s approved procedures and local regulations. Emberline records and checks them; it does not approve them.',
} as const;
