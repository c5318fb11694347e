/** Local stand-ins for hosted services (mail sink, …) that the start and test commands run. */
export interface Services {
  env: Record<string, string>;
  close(): Promise<void>;
}

export async function startServices(_env: NodeJS.ProcessEnv): Promise<Services> {
  return { env: {}, async close() {} };
}
