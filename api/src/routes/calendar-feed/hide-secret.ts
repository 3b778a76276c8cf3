/** The part of a feed address that is the secret, in a path. */
const FEED_SECRET = /^(\/feeds\/visits\/)[^/?#]+/;

/**
 * A request's path with a feed's secret left out ("/feeds/visits/…"), for the request log:
 * whoever reads the logs must not be able to subscribe to someone's visits.
 */
export function hideFeedSecret(url: string): string {
  return url.replace(FEED_SECRET, '$1…');
}

/** The request log's view of a request (pino's serialized form) without a feed's secret. */
export function withoutFeedSecret<R extends { url?: string; params?: unknown }>(req: R): R {
  if (typeof req.url !== 'string' || !FEED_SECRET.test(req.url)) return req;
  return { ...req, url: hideFeedSecret(req.url), params: {} };
}
