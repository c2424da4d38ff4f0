import { useQuery } from '@tanstack/react-query';
import { listLibrary } from '../../library/api/library-store';
import { viewKeys } from './keys';

/** Whether this browser's library holds the recording with this fingerprint (false when IndexedDB is closed to us). */
export function useInLocalLibrary(fingerprint: string | null) {
  return useQuery({
    queryKey: [...viewKeys.all, 'in-library', fingerprint],
    queryFn: async () => {
      try {
        return (await listLibrary()).some((e) => e.fingerprint === fingerprint);
      } catch {
        return false;
      }
    },
    enabled: fingerprint !== null,
    staleTime: 0,
  });
}
