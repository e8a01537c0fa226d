import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import { showServerErrors } from '@/lib/queries/request';

/**
 * A review write (submit, decide, remark) as a mutation: on success `after` gets the answer (a
 * list can show it at once) and the page's server data (badge, timeline, lists) is read again; on failure the server's issues go
 * beside the fields they name, the rest under the form.
 */
export function useReviewWrite<F extends FieldValues, T, V, R>(
  form: UseFormReturn<F, unknown, T>,
  fields: readonly Path<F>[],
  send: (values: V) => Promise<R>,
  after?: (result: R) => void,
) {
  const router = useRouter();
  return useMutation({
    mutationFn: send,
    onMutate: () => form.clearErrors(),
    onSuccess: (result) => {
      after?.(result);
      router.refresh();
    },
    onError: (err) => showServerErrors(err, fields, form.setError),
  });
}
