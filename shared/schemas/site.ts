/** A site of the plant group: a works with its own address and time zone. */
import { z } from 'zod';
import { changeShape, listQuerySchema, optionalText, requiredText, storableString, versionField, type RecordMeta } from './common';

/** True when `value` is an IANA time zone this runtime knows, e.g. "Europe/London". */
export function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value });
    return value.length > 0;
  } catch {
    return false;
  }
}

const siteFields = {
  name: requiredText(120, 'site name'),
  /** Short code used in cabinet tags, e.g. "M" in BRK-M2-VFD-014. */
  code: storableString('code', 'Enter a short code.')
    .trim()
    .toUpperCase()
    .regex(/^[A-Z0-9]{1,6}$/, 'Use 1 to 6 letters or digits, e.g. M or HQ.'),
  address: optionalText(500, 'address'),
  timeZone: storableString('time zone', 'Choose a time zone.')
    .trim()
    .refine(isTimeZone, 'Choose a time zone such as Europe/London.'),
};

/** Fields a person enters for a site. */
export const siteInputSchema = z.object(siteFields);
export type SiteInput = z.input<typeof siteInputSchema>;
export type SiteData = z.output<typeof siteInputSchema>;

/** A change to a site: any of its fields, with the version the editor read. */
export const siteUpdateSchema = z.object({ ...changeShape(siteFields), version: versionField });
export type SiteUpdate = z.output<typeof siteUpdateSchema>;

export const SITE_SORT_FIELDS = ['name', 'code', 'updatedAt'] as const;
export const siteListQuerySchema = listQuerySchema(SITE_SORT_FIELDS, 'name', {});
export type SiteListQuery = z.output<typeof siteListQuerySchema>;

/** A site as the API returns it. */
export interface Site extends RecordMeta, SiteData {
  areaCount: number;
  cabinetCount: number;
}
