import { useState } from 'react';
import type { AssayDetail } from '#shared/schemas/germination';
import { Card } from '#src/components/ui/card';
import { traySubjectId } from '#src/lib/bank-api';
import { PhotoGallery } from '#src/features/photos/components/photo-gallery';
import { cn } from '#src/lib/cn';

/**
 * Photos of a test's trays, one tray at a time: a picture on a check day shows what the numbers
 * cannot (mould creeping in, seedlings that came up twisted). Growers add and delete; a viewer looks.
 */
export function TrayPhotos({
  bankId,
  detail,
  canEdit,
}: {
  bankId: string;
  detail: AssayDetail;
  canEdit: boolean;
}) {
  const trays = [...detail.trays].sort((a, b) => a.position - b.position);
  const [trayId, setTrayId] = useState(trays[0]?.id ?? '');
  const tray = trays.find((t) => t.id === trayId) ?? trays[0];
  if (!tray) return null;
  const code = detail.test.lotCode;
  return (
    <Card
      title="Tray photos"
      description="A photo on a check day keeps what the counts cannot: mould, damping-off, odd seedlings."
    >
      {trays.length > 1 ? (
        <div
          role="group"
          aria-label="Tray"
          className="mb-4 inline-flex flex-wrap rounded-lg border border-loam-300 bg-white p-0.5"
        >
          {trays.map((t) => (
            <button
              key={t.id}
              type="button"
              aria-pressed={t.id === tray.id}
              onClick={() => setTrayId(t.id)}
              className={cn(
                'min-h-11 min-w-11 rounded-md px-3 font-semibold',
                t.id === tray.id ? 'bg-moss-700 text-white' : 'text-loam-800 hover:bg-husk-100',
              )}
            >
              Tray {t.position}
            </button>
          ))}
        </div>
      ) : null}
      <PhotoGallery
        key={tray.id}
        bankId={bankId}
        subject="tray"
        subjectId={traySubjectId(detail.test.id, tray.id)}
        canEdit={canEdit}
        describe={(i) => `Tray ${tray.position} of the ${code} test${i > 0 ? `, photo ${i + 1}` : ''}`}
      />
    </Card>
  );
}
