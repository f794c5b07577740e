import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button.tsx';
import type { BarcodeDetectorLike } from '../hooks/use-barcode-detector.ts';

/** Reads a label through the tablet's back camera until one code is found, then stops the camera. */
export function CameraScan({ detector, onDetected, onClose }: { detector: BarcodeDetectorLike; onDetected: (raw: string) => void; onClose: () => void }) {
  const video = useRef<HTMLVideoElement>(null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    let stream: MediaStream | null = null;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let live = true;
    const look = async () => {
      const v = video.current;
      if (!live || !v) return;
      if (v.readyState >= 2) {
        const found = await detector.detect(v).catch(() => []);
        const first = found.find((b) => b.rawValue);
        if (first && live) { onDetected(first.rawValue); return; }
      }
      timer = setTimeout(() => void look(), 200);
    };
    void (async () => {
      try {
        stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: 'environment' }, audio: false });
        if (!live || !video.current) return;
        video.current.srcObject = stream;
        await video.current.play().catch(() => undefined);
        void look();
      } catch (err) {
        setError(err instanceof Error && err.name === 'NotAllowedError' ? 'The camera was not allowed. Type or use the hand-held scanner instead.' : 'The camera could not be started. Type or use the hand-held scanner instead.');
      }
    })();
    return () => {
      live = false;
      clearTimeout(timer);
      stream?.getTracks().forEach((t) => t.stop());
    };
  }, [detector, onDetected]);
  return (
    <div className="flex flex-col gap-2 rounded-control border-2 border-line-strong bg-sunken p-2">
      {error ? <p role="alert" className="font-bold text-danger">{error}</p> : (
        <video ref={video} muted playsInline aria-label="Camera view: hold the label's code in the frame" className="aspect-video w-full rounded-control bg-[black] object-cover" />
      )}
      <Button onClick={onClose}>Stop the camera</Button>
    </div>
  );
}
