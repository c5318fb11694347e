/** Console helpers for the start and test scripts. */
export function log(message: string): void {
  console.log(`[stallpoint] ${message}`);
}

export function fail(message: string): never {
  console.error(`[stallpoint] ${message}`);
  process.exit(1);
}
