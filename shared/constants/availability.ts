/**
 * What a person reads when Ebbline cannot serve a request for a moment: the API sends it with a
 * 503 and the web shows it wherever that request's error appears.
 */
export const DATABASE_UNAVAILABLE_MESSAGE =
  "Ebbline can't reach its database; your work is kept, try again in a moment.";

/** The same while Ebbline is stopping (a restart or an update): new requests wait for the next start. */
export const STOPPING_MESSAGE = 'Ebbline is stopping; your work is kept, try again in a moment.';
