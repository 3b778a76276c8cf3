import type { Spare, SpareInput, SpareUpdate } from '../../../../../shared/schemas/spare';
import { createResourceApi } from './resource';

/** GET/POST /api/spares, GET/PATCH/DELETE /api/spares/:spareId, GET …/audit. */
export const sparesApi = createResourceApi<Spare, Spare, SpareInput, SpareUpdate>('spares', '/api/spares');
