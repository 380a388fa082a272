import { registerAs } from '@nestjs/config';

/** Default of KW_OPEN_REQUEST_LIMIT: jobs one requester may have open with the workshop at a time. */
export const DEFAULT_OPEN_REQUEST_LIMIT = 5;

export const jobsConfig = registerAs('jobs', () => ({
  /**
   * How many jobs one requester (not a fabricator or supervisor) may have open with the workshop at a time
   * (JOB_OPEN_STATES): each request mails every fabricator. Validated at boot (env.validation.ts).
   */
  openRequestLimit: Number(process.env.KW_OPEN_REQUEST_LIMIT ?? DEFAULT_OPEN_REQUEST_LIMIT),
}));
