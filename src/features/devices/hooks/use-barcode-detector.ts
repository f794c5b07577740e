import { useEffect, useState } from 'react';

/**
 * A reader of codes in camera frames: the Shape Detection API's BarcodeDetector (WICG, "Accelerated
 * Shape Detection in Images") where the browser has it, else ZXing (`zxing-detector.ts`). Without a
 * camera API at all the camera button is not shown.
 */
export interface DetectedBarcode { rawValue: string; format: string }
export interface BarcodeDetectorLike { detect(source: CanvasImageSource): Promise<DetectedBarcode[]> }
type DetectorClass = {
  new (options?: { formats?: string[] }): BarcodeDetectorLike;
  getSupportedFormats?: () => Promise<string[]>;
};

/** Formats device labels carry: GS1 DataMatrix and GS1-128 above all, HIBC in Code 128 or 39, QR for Digital Link. */
export const LABEL_FORMATS = ['data_matrix', 'code_128', 'code_39', 'qr_code', 'ean_13', 'itf'];

const hasCamera = () => typeof navigator !== 'undefined' && Boolean(navigator.mediaDevices?.getUserMedia);

export function barcodeDetectorClass(): DetectorClass | null {
  const g = globalThis as unknown as { BarcodeDetector?: DetectorClass };
  return g.BarcodeDetector && hasCamera() ? g.BarcodeDetector : null;
}

/** The browser's own detector for the label formats it supports, or null when it reads none of them. */
async function nativeDetector(Detector: DetectorClass): Promise<BarcodeDetectorLike | null> {
  const supported = (await Detector.getSupportedFormats?.().catch(() => [] as string[])) ?? LABEL_FORMATS;
  const formats = LABEL_FORMATS.filter((f) => supported.includes(f));
  return formats.length ? new Detector({ formats }) : null;
}

/** A detector for the label formats, or null where the browser has no camera API. */
export function useBarcodeDetector(): BarcodeDetectorLike | null {
  const [detector, setDetector] = useState<BarcodeDetectorLike | null>(null);
  useEffect(() => {
    if (!hasCamera()) return;
    const Detector = barcodeDetectorClass();
    let live = true;
    void (async () => {
      const found = (Detector ? await nativeDetector(Detector) : null)
        ?? await import('./zxing-detector.ts').then((m) => m.zxingDetector()).catch(() => null);
      if (live && found) setDetector(found);
    })();
    return () => { live = false; };
  }, []);
  return detector;
}
