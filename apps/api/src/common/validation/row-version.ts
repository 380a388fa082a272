import { applyDecorators } from '@nestjs/common';
import { IsInt, Max, Min } from 'class-validator';

/** Largest value a PostgreSQL `integer` column (the version and lockVersion columns) holds. */
export const MAX_ROW_VERSION = 2_147_483_647;

/**
 * A version number the client read (optimistic locking): a whole number from 1 to the largest the column
 * holds. Without the upper limit `1e308` passes as an integer and comes back as a misleading 409 "stale".
 */
export const IsRowVersion = (): PropertyDecorator => applyDecorators(IsInt(), Min(1), Max(MAX_ROW_VERSION));
