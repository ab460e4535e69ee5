import { Alert } from '@/components/ui/alert';

/** Said wherever a member can start a payment while the server uses test keys or the local fake. */
export function TestModeNote() {
  return (
    <Alert tone="warning" title="Test payments only">
      This Blockpost is set up with a test payment service: its payment page takes no card and moves no money. Nothing you do
      there is charged.
    </Alert>
  );
}

export function PaymentsOffNote() {
  return (
    <Alert tone="info" title="Online payments are not set up">
      Pay your guild’s treasurer the way the guild usually does (cash or cheque at a meeting); they can mark it in their own
      records.
    </Alert>
  );
}
