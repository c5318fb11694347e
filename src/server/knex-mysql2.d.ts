/** knex's mysql2 dialect, imported directly so the app can extend it (src/server/knex-client.ts). */
declare module 'knex/lib/dialects/mysql2/index.js' {
  import type { Knex } from 'knex';
  const Client_MySQL2: typeof Knex.Client;
  export default Client_MySQL2;
}
