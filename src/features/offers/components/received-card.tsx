import { Card } from '#src/components/ui/card';
import { useReceived } from '../api/get-received';
import { ReceivedTests } from './received-tests';

/**
 * A lot received from another bank: where it came from (as far as the giver allowed) and the
 * giver's tests, read-only — the giver's evidence, which this bank's advice uses as the lot's tests.
 * Nothing for a lot that was not received. Loaded lazily by the lot page.
 */
export default function ReceivedCard({ bankId, lotId }: { bankId: string; lotId: string }) {
  const { data: received } = useReceived(bankId, lotId);
  if (!received) return null;
  const from = received.giverBankName
    ? `lot ${received.giverLotCode} of ${received.giverBankName}`
    : `lot ${received.giverLotCode} of another Hilum bank`;
  return (
    <Card
      title="History from the giver"
      description={`Received ${received.seeds} seeds from ${from}.`}
      aria-label="History from the giver"
    >
      <p className="mb-3 text-sm text-loam-700">
        The giver’s evidence, read-only: these tests were run before the seed came here. Hilum counts them as
        this lot’s tests when it projects germination and gives advice.
      </p>
      <ReceivedTests tests={received.tests} label={`The giver’s tests of ${received.giverLotCode}`} />
    </Card>
  );
}
