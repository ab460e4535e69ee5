import { useEffect } from 'react';
import { Button } from '@/components/ui/button';
import { preloadDecoder, useCameraScanner } from '../hooks/use-camera-scanner';

/** The camera view with its on/off switch; a label read here goes the same way as a typed code. */
export function CameraPanel({ onCode }: { onCode: (text: string) => void }) {
  const { videoRef, status, error, engine, start, stop } = useCameraScanner(onCode);
  useEffect(preloadDecoder, []);
  const on = status !== 'off';
  return (
    <section aria-label="Camera" className="rounded-card border border-walnut/15 bg-card px-4 py-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="font-semibold">
          {status === 'on'
            ? 'Hold a label’s QR code in view.'
            : status === 'starting'
              ? 'Starting the camera…'
              : 'Scan labels with the camera'}
        </p>
        <Button variant="secondary" onClick={() => (on ? stop() : void start())}>
          {on ? 'Stop camera' : 'Start camera'}
        </Button>
      </div>
      {error && (
        <p role="alert" className="mt-2 font-semibold text-madder-deep">
          {error}
        </p>
      )}
      <video
        ref={videoRef}
        muted
        playsInline
        aria-label="Camera view"
        className={on ? 'mt-3 aspect-video max-h-56 w-full rounded-lg bg-walnut object-cover' : 'hidden'}
      />
      {status === 'on' && (
        <p className="mt-1 text-base text-walnut-soft">
          {engine === 'native'
            ? 'Reading codes with the browser’s own detector.'
            : 'Reading codes on this device (no detector built into this browser).'}
        </p>
      )}
    </section>
  );
}
