/**
 * Reads QR codes from the camera: the browser's own BarcodeDetector where it knows QR codes, else
 * jsqr on frames drawn into a canvas. A label held in view is read once, not over and over.
 */
import { useCallback, useEffect, useRef, useState } from 'react';

interface DetectedBarcode {
  rawValue: string;
}
interface BarcodeDetectorLike {
  detect(source: CanvasImageSource): Promise<DetectedBarcode[]>;
}
interface BarcodeDetectorClass {
  new (options: { formats: string[] }): BarcodeDetectorLike;
  getSupportedFormats(): Promise<string[]>;
}

type Reader = (video: HTMLVideoElement) => Promise<string | null>;

const FRAME_MS = 150;
const SAME_CODE_PAUSE_MS = 3000;
/** jsqr is quick enough on a 640 px frame and finds labels held a hand's width from the lens. */
const JSQR_WIDTH = 640;

async function nativeReader(): Promise<Reader | null> {
  const Detector = (window as unknown as { BarcodeDetector?: BarcodeDetectorClass }).BarcodeDetector;
  if (!Detector) return null;
  try {
    if (!(await Detector.getSupportedFormats()).includes('qr_code')) return null;
    const detector = new Detector({ formats: ['qr_code'] });
    return async (video) => (await detector.detect(video))[0]?.rawValue ?? null;
  } catch {
    return null;
  }
}

async function jsqrReader(): Promise<Reader> {
  const { default: jsQR } = await import('jsqr');
  const canvas = document.createElement('canvas');
  const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
  return async (video) => {
    const scale = Math.min(1, JSQR_WIDTH / video.videoWidth);
    canvas.width = Math.round(video.videoWidth * scale);
    canvas.height = Math.round(video.videoHeight * scale);
    ctx.drawImage(video, 0, 0, canvas.width, canvas.height);
    const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
    return jsQR(data, canvas.width, canvas.height, { inversionAttempts: 'dontInvert' })?.data ?? null;
  };
}

/** Loads the fallback decoder ahead of time so it is on the device before the network goes. */
export const preloadDecoder = () => void import('jsqr');

function cameraMessage(error: unknown): string {
  const name = (error as { name?: string })?.name;
  if (name === 'NotAllowedError')
    return 'The camera was not allowed. Allow it in the browser’s settings for this site, or type the short codes.';
  if (name === 'NotFoundError' || name === 'OverconstrainedError')
    return 'No camera was found on this device. Type the short codes instead.';
  if (name === 'NotReadableError') return 'Another app is using the camera. Close it and try again, or type the short codes.';
  return 'The camera could not start. Type the short codes instead.';
}

export type CameraStatus = 'off' | 'starting' | 'on';

export function useCameraScanner(onCode: (text: string) => void) {
  const videoRef = useRef<HTMLVideoElement>(null);
  const [status, setStatus] = useState<CameraStatus>('off');
  const [error, setError] = useState<string | null>(null);
  const [engine, setEngine] = useState<'native' | 'jsqr' | null>(null);
  const session = useRef<{ stream: MediaStream; timer?: ReturnType<typeof setTimeout>; stopped: boolean } | null>(null);
  const last = useRef<{ text: string; at: number } | null>(null);
  const onCodeRef = useRef(onCode);
  useEffect(() => {
    onCodeRef.current = onCode;
  }, [onCode]);

  const stop = useCallback(() => {
    const s = session.current;
    if (s) {
      s.stopped = true;
      clearTimeout(s.timer);
      for (const track of s.stream.getTracks()) track.stop();
    }
    session.current = null;
    if (videoRef.current) videoRef.current.srcObject = null;
    setStatus('off');
  }, []);

  const start = useCallback(async () => {
    setError(null);
    if (!navigator.mediaDevices?.getUserMedia) {
      setError('The camera needs the secure (https) address of Blockpost. Type the short codes instead.');
      return;
    }
    setStatus('starting');
    try {
      const stream = await navigator.mediaDevices.getUserMedia({
        video: { facingMode: { ideal: 'environment' }, width: { ideal: 1280 } },
        audio: false,
      });
      const s: NonNullable<typeof session.current> = { stream, stopped: false };
      session.current = s;
      const video = videoRef.current!;
      video.srcObject = stream;
      await video.play();
      const native = await nativeReader();
      const read = native ?? (await jsqrReader());
      setEngine(native ? 'native' : 'jsqr');
      setStatus('on');
      const tick = async () => {
        if (s.stopped) return;
        if (video.readyState >= 2 && video.videoWidth > 0) {
          const text = await read(video).catch(() => null);
          const now = Date.now();
          if (text && !(last.current?.text === text && now - last.current.at < SAME_CODE_PAUSE_MS)) onCodeRef.current(text);
          if (text) last.current = { text, at: now };
        }
        s.timer = setTimeout(() => void tick(), FRAME_MS);
      };
      void tick();
    } catch (e) {
      stop();
      setError(cameraMessage(e));
    }
  }, [stop]);

  useEffect(() => stop, [stop]);

  return { videoRef, status, error, engine, start, stop };
}
