/** An area of a site: a line, hall or plant room holding cabinets. */
import { z } from 'zod';
import { changeShape, listQuerySchema, optionalText, recordId, requiredText, versionField, type RecordMeta } from './common';

/** Fields a person enters for an area. */
const areaFields = {
  name: requiredText(120, 'area name'),
  description: optionalText(1000, 'description'),
};
export const areaInputSchema = z.object({ siteId: recordId('site'), ...areaFields });
export type AreaInput = z.input<typeof areaInputSchema>;
export type AreaData = z.output<typeof areaInputSchema>;

/** A change to an area. Moving an area to another site is not a change: retire it instead. */
export const areaUpdateSchema = z.object({ ...changeShape(areaFields), version: versionField });
export type AreaUpdate = z.output<typeof areaUpdateSchema>;

export const AREA_SORT_FIELDS = ['name', 'site', 'updatedAt'] as const;
export const areaListQuerySchema = listQuerySchema(AREA_SORT_FIELDS, 'name', {
  siteId: z.uuid().optional(),
});
export type AreaListQuery = z.output<typeof areaListQuerySchema>;

/** An area as the API returns it. */
export interface Area extends RecordMeta, AreaData {
  siteName: string;
  siteCode: string;
  cabinetCount: number;
}
