import { useParams } from 'react-router';
import { useOutboxMessage } from '@frontend/features/outbox/api/get-outbox-message';
import { MessageView } from '@frontend/features/outbox/components/message-view';
import { ErrorState, LoadingState } from '@frontend/components/states';

/** /outbox/:messageId — one captured e-mail beside the list. */
export function Component() {
  const { messageId = '' } = useParams();
  const message = useOutboxMessage(messageId);
  if (message.isPending) return <LoadingState label="Loading the message…" />;
  if (message.isError) return <ErrorState title="Could not load this message" error={message.error} onRetry={() => message.refetch()} />;
  return <MessageView message={message.data} />;
}

export { RouteErrorBoundary as ErrorBoundary } from '../route-error';
