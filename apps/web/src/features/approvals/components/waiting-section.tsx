import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { type ReactNode, type Ref } from 'react';
import { ErrorPanel } from '../../../components/errors/error-panel';

interface WaitingSectionProps<T> {
  heading: string;
  query: {
    isError: boolean;
    error: unknown;
    refetch: () => unknown;
    data: { total: number; items: readonly T[] } | undefined;
  };
  errorTitle: string;
  emptyText: string;
  /** Space below the section (none for the last one). */
  spacing?: number;
  /** The heading takes the focus from here when a decided card leaves the list (tabIndex −1). */
  headingRef?: Ref<HTMLHeadingElement>;
  children: (item: T) => ReactNode;
}

/** One kind of thing waiting for a decision: a heading with the count, then a card each (or why there are none). */
export function WaitingSection<T>({
  heading,
  query,
  errorTitle,
  emptyText,
  spacing,
  headingRef,
  children,
}: WaitingSectionProps<T>) {
  const gap = spacing === undefined ? undefined : { mb: spacing };
  return (
    <>
      <Typography ref={headingRef} tabIndex={-1} variant="h2" sx={{ fontSize: '1.35rem', mb: 2 }}>
        {heading} {query.data ? `(${query.data.total})` : ''}
      </Typography>
      {query.isError ? (
        <ErrorPanel title={errorTitle} error={query.error} onRetry={() => void query.refetch()} />
      ) : !query.data ? (
        <Skeleton variant="rounded" height={120} sx={gap} />
      ) : query.data.items.length === 0 ? (
        <Typography sx={gap}>{emptyText}</Typography>
      ) : (
        <Stack spacing={2} sx={spacing === undefined ? undefined : { mb: spacing + 1 }}>
          {query.data.items.map(children)}
        </Stack>
      )}
    </>
  );
}
