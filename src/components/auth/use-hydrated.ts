/** False in the server-rendered HTML and until React has taken over the form; submit buttons wait for it. */
import { useEffect, useState } from 'react';

export function useHydrated(): boolean {
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  return hydrated;
}
