import type { Site, SiteInput, SiteUpdate } from '../../../../../shared/schemas/site';
import { createResourceApi } from './resource';

/** GET/POST /api/sites, GET/PATCH/DELETE /api/sites/:siteId, GET …/audit. */
export const sitesApi = createResourceApi<Site, Site, SiteInput, SiteUpdate>('sites', '/api/sites');
