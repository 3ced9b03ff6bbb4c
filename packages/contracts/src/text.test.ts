import { describe, expect, it } from 'vitest';
import { nameText, noteText } from './text';

const name = nameText('Enter the name');
const note = noteText(200);
const messageOf = (result: { success: boolean; error?: { issues: { message: string }[] } }) =>
  result.error?.issues[0]?.message;

describe('names and notes people type', () => {
  it('takes names in any script, trimmed', () => {
    expect(name.parse('  Corvid Regional Airways ')).toBe('Corvid Regional Airways');
    expect(name.parse('Düsenwerk Nord')).toBe('Düsenwerk Nord');
    expect(name.parse('第一整備')).toBe('第一整備');
  });

  it('refuses control characters and names made only of invisible characters', () => {
    // U+0000, U+0007 (bell), U+001B (escape), U+007F (delete), U+0085 (next line): Unicode Cc.
    for (const bad of [
      'Corvid\u0000',
      'Bell\u0007',
      '\u001b[31mRed',
      'Del\u007f',
      'Next\u0085line',
      'Two\nlines',
    ])
      expect(messageOf(name.safeParse(bad))).toBe('cannot hold control characters');
    // Zero-width space, zero-width joiner, left-to-right mark, word joiner, no-break space.
    for (const invisible of ['\u200b', '\u200d\u200b', '\u200e', '\u2060', '\u00a0\u200b'])
      expect(name.safeParse(invisible).success).toBe(false);
    expect(messageOf(name.safeParse(''))).toBe('Enter the name');
  });

  it('keeps line breaks and tabs in notes and refuses other control characters', () => {
    expect(note.parse('Seen at 12 o’clock.\nRe-check at the next visit.\tOK')).toBe(
      'Seen at 12 o’clock.\nRe-check at the next visit.\tOK',
    );
    expect(note.parse('Windows line\r\nbreak')).toBe('Windows line\r\nbreak');
    expect(messageOf(note.safeParse('escape \u001b[2J'))).toBe(
      'cannot hold control characters (line breaks and tabs are fine)',
    );
    expect(note.safeParse('nul \u0000').success).toBe(false);
  });
});

describe('every free text of the API', () => {
  // One field of each kind, as the forms send it: a control character is refused in each, a line
  // break kept where a note may have one.
  const escape = 'Seen \u001b[2J here';
  it('refuses control characters in rule titles, references, booking notes, reasons and rationales', async () => {
    const { ruleSchema } = await import('./limits');
    const { bookingInputSchema } = await import('./planning');
    const { voidInputSchema } = await import('./findings');
    const { voidInspectionInputSchema, returnToDraftInputSchema } = await import('./inspections');
    const { dispositionFormSchema } = await import('./review');
    const { limitSetCopyInputSchema } = await import('./limit-sets');
    const { contactInputSchema } = await import('./organisations');
    const titleField = ruleSchema.shape.title;
    expect(titleField.safeParse(escape).success).toBe(false);
    expect(titleField.safeParse('Cracks at the\nedges').success).toBe(false);
    expect(titleField.parse('Cracks at the edges')).toBe('Cracks at the edges');
    expect(ruleSchema.shape.reference.safeParse('§72-00 \u0000').success).toBe(false);
    expect(bookingInputSchema.shape.note.safeParse(escape).success).toBe(false);
    expect(bookingInputSchema.shape.note.parse('Hangar 2\nMorning shift')).toBe(
      'Hangar 2\nMorning shift',
    );
    expect(voidInputSchema.shape.reason.safeParse(`Wrong vane ${escape}`).success).toBe(false);
    expect(voidInspectionInputSchema.shape.reason.safeParse(escape).success).toBe(false);
    expect(returnToDraftInputSchema.shape.reason.safeParse(escape).success).toBe(false);
    expect(dispositionFormSchema.shape.rationale.safeParse(escape).success).toBe(false);
    expect(
      dispositionFormSchema.shape.rationale.parse('Within limits.\nRe-check in 400 cycles.'),
    ).toBe('Within limits.\nRe-check in 400 cycles.');
    expect(limitSetCopyInputSchema.shape.manualReference.safeParse(escape).success).toBe(false);
    expect(contactInputSchema.shape.role.safeParse('\u200b').success).toBe(false);
  });
});
