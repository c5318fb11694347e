/** JSON calls from the catalogue islands: the shared client (src/components/api-client.ts). */
export { sendJson, type ApiIssue, type ApiResult } from '../api-client.ts';
