import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ApiError } from '@/lib/api-client';
import { useShareToChat } from '../api/share-to-chat';
import { canvasBlob } from '../lib/render-wall';

interface KeepAndShareProps {
  swapId: number;
  swapTitle: string;
  /** Draws the wall as it is now. */
  picture: () => Promise<HTMLCanvasElement>;
  shareText: string;
  onPrint: () => void;
}

/** Print, download or share the wall as one picture. */
export function KeepAndShare({ swapId, swapTitle, picture, shareText, onPrint }: KeepAndShareProps) {
  const share = useShareToChat(swapId);
  const [shared, setShared] = useState<string | null>(null);

  const download = async () => {
    const blob = await canvasBlob(await picture());
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = `design-wall-${swapTitle.replace(/[^\w-]+/g, '-').slice(0, 40)}.png`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
  };
  const shareNow = async () => {
    setShared(null);
    const blob = await canvasBlob(await picture());
    share.mutate({ picture: blob, text: shareText }, { onSuccess: () => setShared('Shared to the swap chat as a photo.') });
  };

  return (
    <Card title="Keep and share">
      <div className="flex flex-wrap gap-3">
        <Button variant="secondary" onClick={onPrint}>
          Print a one-page plan
        </Button>
        <Button variant="secondary" onClick={() => void download()}>
          Download as a picture (PNG)
        </Button>
        <Button variant="secondary" onClick={() => void shareNow()} pending={share.isPending} pendingLabel="Sharing…">
          Share to the swap chat
        </Button>
      </div>
      {shared && <p className="mt-2 font-semibold text-lichen-deep">✓ {shared}</p>}
      {share.isError && (
        <Alert tone="error">{share.error instanceof ApiError ? share.error.message : 'The picture could not be shared.'}</Alert>
      )}
    </Card>
  );
}
