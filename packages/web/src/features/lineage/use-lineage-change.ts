import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError } from '../../lib/api';

/**
 * Sends a split or a combine. Once it is written, `done` holds the server's answer and every
 * lot query is refetched (parents and the new lots all change); `err` is a refused request.
 */
export function useLineageChange<R>(send: () => Promise<R>, onDone?: (r: R) => void) {
  const client = useQueryClient();
  const [done, setDone] = useState<R | null>(null);
  const mutation = useMutation({
    mutationFn: send,
    onSuccess: async (r) => {
      setDone(r);
      onDone?.(r);
      await client.invalidateQueries({ queryKey: ['lots'] });
    },
  });
  const err = mutation.error instanceof ApiError ? mutation.error : null;
  return { mutation, done, err };
}
