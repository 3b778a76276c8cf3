import type { Area, AreaInput, AreaUpdate } from '../../../../../shared/schemas/area';
import { createResourceApi } from './resource';

/** GET/POST /api/areas, GET/PATCH/DELETE /api/areas/:areaId, GET …/audit. */
export const areasApi = createResourceApi<Area, Area, AreaInput, AreaUpdate>('areas', '/api/areas');
