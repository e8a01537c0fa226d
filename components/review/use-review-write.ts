import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import type { FieldValues, Path, UseFormReturn } from 'react-hook-form';
import { showServerErrors } from '@/lib/queries/request';

/**
 * A review write (submit, decide, remark) as a mutation: on success the form is emptied and the
 * page's server data (badge, timeline, lists) is read again; on failure the server's issues go
 * beside the fields they name, the rest under the form.
 */
export function useReviewWrite<F extends FieldValues, T, V, R>(
  form: UseFormReturn<F, unknown, T>,
  fields: readonly Path<F>[],
  send: (values: V) => Promise<R>,
  after?: () => void,
) {
  const router = useRouter();
  return useMutation({
    mutationFn: send,
    onMutate: () => form.clearErrors(),
    onSuccess: () => {
      after?.();
      router.refresh();
    },
    onError: (err) => showServerErrors(err, fields, form.setError),
  });
}
