/**
 * Limits of a logger or oscilloscope file read for a decay run. The API refuses a file over a
 * limit (413 naming it) and the web checks the size before sending, so a person hears it at once.
 */

/** Largest logger file accepted, in bytes (5 MiB: a long scope export of a few channels). */
export const LOGGER_FILE_MAX_BYTES = 5 * 1024 * 1024;

/** The size limit in whole MiB, for messages ("5 MB"). */
export const LOGGER_FILE_MAX_MEBIBYTES = LOGGER_FILE_MAX_BYTES / 1024 / 1024;

/**
 * Most lines of a logger file that are read (preamble, header and readings): a longer file is
 * refused before it is read. A decay run needs a few hundred readings and holds at most 20,000;
 * the reader reads a file in one step, so this bounds how long it holds the server (about 40 ms
 * at 50,000 lines on a two-core machine at rest, up to 0.2 s while it runs other work).
 */
export const LOGGER_FILE_MAX_LINES = 50_000;

/** Rows under the header shown beside the column picker when the columns must be chosen. */
export const LOGGER_FILE_CANDIDATE_ROWS = 5;
