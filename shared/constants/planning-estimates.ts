/**
 * Figures the Planner estimates a visit's length with (shared/domain/visit-duration.ts). They
 * are planning estimates, not safety figures: the marked wait on the cabinet and a meter reading
 * always decide when a bus may be touched (DISCHARGE_CAUTION, shared/constants/safety.ts).
 */

/**
 * Minutes of work per bank besides the capture itself: lockout/tagout and proof of isolation,
 * opening the cabinet, connecting the logger and the meter, recording the bank temperature and
 * closing up (common practice, from memory: a quarter of an hour for a trained technician).
 */
export const BANK_SETUP_MINUTES = 15;

/**
 * Captures last this many time constants: after 5 τ less than 1 % of the voltage remains, so
 * the decay is complete for the fit (DOMAIN.md: "after 5 tau under 1 %").
 */
export const CAPTURE_TIME_CONSTANTS = 5;

/**
 * The wait planned for a cabinet with no marked wait time in the register: the longest of the
 * waits drive manuals commonly mark (DOMAIN.md: "manuals commonly say 3-15 min"), so an unknown
 * wait is never planned short.
 */
export const UNKNOWN_MARKED_WAIT_MINUTES = 15;
