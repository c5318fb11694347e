/**
 * Runtime configuration from the environment (see README "Configuration").
 * The start and test scripts load .env / generated values into process.env before anything reads this.
 */
export interface DbConfig {
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
}

export function dbConfigFromEnv(env: NodeJS.ProcessEnv = process.env): DbConfig {
  return {
    host: env.DB_HOST ?? '127.0.0.1',
    port: Number(env.DB_PORT ?? 3407),
    database: env.DB_NAME ?? 'stallpoint',
    user: env.DB_USER ?? 'stallpoint',
    password: env.DB_PASSWORD ?? '',
  };
}

export function dataDirFromEnv(env: NodeJS.ProcessEnv = process.env): string {
  return env.DATA_DIR ?? '.data';
}
