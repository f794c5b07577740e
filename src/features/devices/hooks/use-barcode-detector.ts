import { useEffect, useState } from 'react';

/**
 * The Shape Detection API's BarcodeDetector (WICG, "Accelerated Shape Detection in Images"), where the
 * browser has it. Feature-detected: without it the camera button is not shown at all.
 */
export interface DetectedBarcode { rawValue: string; format: string }
export interface BarcodeDetectorLike { detect(source: CanvasImageSource): Promise<DetectedBarcode[]> }
type DetectorClass = {
  new (options?: { formats?: string[] }): BarcodeDetectorLike;
  getSupportedFormats?: () => Promise<string[]>;
};

/** Formats device labels carry: GS1 DataMatrix and GS1-128 above all, HIBC in Code 128 or 39, QR for Digital Link. */
export const LABEL_FORMATS = ['data_matrix', 'code_128', 'code_39', 'qr_code', 'ean_13', 'itf'];

export function barcodeDetectorClass(): DetectorClass | null {
  const g = globalThis as unknown as { BarcodeDetector?: DetectorClass };
  const hasCamera = typeof navigator !== 'undefined' && Boolean(navigator.mediaDevices?.getUserMedia);
  return g.BarcodeDetector && hasCamera ? g.BarcodeDetector : null;
}

/** A detector for the label formats the browser supports, or null when it has none. */
export function useBarcodeDetector(): BarcodeDetectorLike | null {
  const [detector, setDetector] = useState<BarcodeDetectorLike | null>(null);
  useEffect(() => {
    const Detector = barcodeDetectorClass();
    if (!Detector) return;
    let live = true;
    void (async () => {
      const supported = (await Detector.getSupportedFormats?.().catch(() => [] as string[])) ?? LABEL_FORMATS;
      const formats = LABEL_FORMATS.filter((f) => supported.includes(f));
      if (live && formats.length) setDetector(new Detector({ formats }));
    })();
    return () => { live = false; };
  }, []);
  return detector;
}
