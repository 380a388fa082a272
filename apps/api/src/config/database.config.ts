import { registerAs } from '@nestjs/config';
import { readDbOptions } from '@kerfwright/db';

export const databaseConfig = registerAs('database', () => readDbOptions(process.env));
export type DatabaseConfig = ReturnType<typeof databaseConfig>;
