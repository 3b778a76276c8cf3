import type { Role } from '../../../../shared/constants/roles';

/** Who may read a logger file for a decay run: those who record runs and those who review them. */
export const loggerFilePolicy = {
  preview: ['technician', 'reliability', 'admin'] as readonly Role[],
} as const;
