import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { areaUpdateSchema } from '../../../shared/schemas/area';
import { bankUpdateSchema } from '../../../shared/schemas/bank';
import { bankDesignUpdateSchema } from '../../../shared/schemas/bank-design';
import { cabinetInputSchema, cabinetUpdateSchema } from '../../../shared/schemas/cabinet';
import {
  calendarDate,
  changeShape,
  isStorableText,
  optionalCalendarDate,
  optionalText,
  requiredText,
} from '../../../shared/schemas/common';
import { shutdownWindowUpdateSchema } from '../../../shared/schemas/shutdown-window';
import { siteUpdateSchema } from '../../../shared/schemas/site';
import { spareUpdateSchema } from '../../../shared/schemas/spare';

describe('isStorableText', () => {
  it('when the text holds a NUL, then PostgreSQL cannot store it', () => {
    expect(isStorableText('bay\u00004')).toBe(false);
  });

  it('when the text holds a lone high or low surrogate, then it cannot be stored', () => {
    expect(isStorableText('a\uD800')).toBe(false);
    expect(isStorableText('\uDC00b')).toBe(false);
    expect(isStorableText('\uDC00\uD800')).toBe(false);
  });

  it('when the text holds a whole surrogate pair, other control characters or accents, then it can', () => {
    expect(isStorableText('pump 🚰 room')).toBe(true);
    expect(isStorableText('tab\there\u0001')).toBe(true);
    expect(isStorableText('Düsseldorf – Halle 2')).toBe(true);
  });
});

describe('text fields', () => {
  it('when a required or optional text holds a NUL, then it is refused naming what it is', () => {
    const result = z
      .object({ name: requiredText(20, 'area name'), notes: optionalText(20, 'notes') })
      .safeParse({ name: 'A\u0000', notes: '\uD800' });
    expect(result.success).toBe(false);
    expect(result.error!.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
      ['name', expect.stringContaining('area name holds a character that cannot be stored')],
      ['notes', expect.stringContaining('notes holds a character that cannot be stored')],
    ]);
  });

  it('when every text field of the cabinet schema gets a lone surrogate, then each is refused', () => {
    const texts = ['tag', 'location', 'driveMake', 'driveModel', 'environmentNotes'];
    const result = cabinetInputSchema.safeParse(
      Object.fromEntries(texts.map((f) => [f, 'X\uDFFF'])),
    );
    const paths = result.error!.issues.map((i) => i.path.join('.'));
    for (const field of texts) expect(paths).toContain(field);
  });
});

describe('calendarDate', () => {
  it.each(['0000-01-01', '1899-12-31', '2201-01-01', '9999-12-31'])(
    'when the date is %s, then it is refused naming the years allowed',
    (date) => {
      const result = calendarDate('install date').safeParse(date);
      expect(result.success).toBe(false);
      expect(result.error!.issues[0]!.message).toBe(
        'The install date must fall between 1900 and 2200.',
      );
    },
  );

  it.each(['1900-01-01', '2026-12-02', '2200-12-31'])(
    'when the date is %s, then it is taken',
    (date) => {
      expect(calendarDate().parse(date)).toBe(date);
    },
  );

  it('when the date does not exist or is not a date, then it is refused', () => {
    expect(calendarDate().safeParse('2025-02-30').success).toBe(false);
    expect(calendarDate().safeParse('yesterday').success).toBe(false);
  });

  it('when an optional date is left out, then it is null', () => {
    expect(optionalCalendarDate().parse(undefined)).toBeNull();
  });
});

describe('changeShape', () => {
  it('when a field with a default is left out of a change, then the change does not name it', () => {
    const schema = z.object(changeShape({ notes: optionalText(10), when: optionalCalendarDate() }));
    expect(schema.parse({})).toEqual({});
    expect(schema.parse({ when: null })).toEqual({ when: null });
  });

  it('when a field is sent, then it is still checked', () => {
    const schema = z.object(changeShape({ notes: optionalText(3, 'notes') }));
    expect(schema.safeParse({ notes: 'too long' }).success).toBe(false);
  });
});

describe('update schemas', () => {
  // zod's .partial() keeps .default()s: a change naming only its version must stay just that
  it.each([
    ['site', siteUpdateSchema],
    ['area', areaUpdateSchema],
    ['cabinet', cabinetUpdateSchema],
    ['bank', bankUpdateSchema],
    ['spare', spareUpdateSchema],
    ['shutdown window', shutdownWindowUpdateSchema],
  ] as const)(
    'when a %s change names only its version, then it fills in no other field',
    (_name, schema) => {
      expect(schema.parse({ version: 3 })).toEqual({ version: 3 });
    },
  );

  it('when a bank design change names only its version, then only the (empty) change note is added', () => {
    expect(bankDesignUpdateSchema.parse({ version: 3 })).toEqual({ version: 3, changeNote: '' });
  });
});
