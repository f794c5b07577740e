import type { BarcodeDetectorLike, DetectedBarcode } from './use-barcode-detector.ts';
import type { FrameAnswer, FrameRequest } from './zxing.worker.ts';

/** Frames wider than this are scaled down before decoding: a label fills enough of the frame at this size. */
const MAX_WIDTH = 1280;

/**
 * Codes read without the browser's BarcodeDetector (Safari and Firefox have none, nor Chromium on a
 * Linux desktop): ZXing's decoders (@zxing/library) in a worker of their own (`zxing.worker.ts`), on the
 * current video frame. The main thread only copies the frame out of a canvas. Loaded only on a tablet
 * that needs it. ZXing writes each FNC1 of a GS1 code as the GS character (ASCII 29), which the label
 * parser reads as GS1's separator.
 */
export function zxingDetector(): BarcodeDetectorLike {
  const worker = new Worker(new URL('./zxing.worker.ts', import.meta.url), { type: 'module' });
  const waiting = new Map<number, { resolve: (found: DetectedBarcode[]) => void; reject: (err: Error) => void }>();
  let next = 0;
  worker.onmessage = ({ data }: MessageEvent<FrameAnswer>) => {
    const w = waiting.get(data.id);
    waiting.delete(data.id);
    if (data.error) w?.reject(new Error(data.error));
    else w?.resolve(data.found ? [data.found] : []);
  };
  worker.onerror = (e) => {
    for (const w of waiting.values()) w.reject(new Error(e.message || 'The code reader stopped'));
    waiting.clear();
  };
  const canvas = document.createElement('canvas');
  const context = canvas.getContext('2d', { willReadFrequently: true });
  return {
    detect(source: CanvasImageSource): Promise<DetectedBarcode[]> {
      const video = source as HTMLVideoElement;
      const scale = Math.min(1, MAX_WIDTH / (video.videoWidth || 1));
      const [width, height] = [Math.round(video.videoWidth * scale), Math.round(video.videoHeight * scale)];
      if (!context || !width || !height) return Promise.resolve([]);
      canvas.width = width;
      canvas.height = height;
      context.drawImage(video, 0, 0, width, height);
      const { data } = context.getImageData(0, 0, width, height);
      const id = ++next;
      return new Promise((resolve, reject) => {
        waiting.set(id, { resolve, reject });
        const request: FrameRequest = { id, width, height, rgba: data.buffer };
        worker.postMessage(request, [data.buffer]);
      });
    },
  };
}
