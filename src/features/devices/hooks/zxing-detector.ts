import type { BarcodeDetectorLike, DetectedBarcode } from './use-barcode-detector.ts';

/**
 * Codes read without the browser's BarcodeDetector (Safari and Firefox have none, nor Chromium on a
 * Linux desktop): ZXing's decoders (@zxing/browser over @zxing/library) on the current video frame,
 * drawn into a canvas. Loaded only on a tablet that needs it. ZXing writes each FNC1 of a GS1 code as
 * the GS character (ASCII 29), which the label parser reads as GS1's separator.
 */
export async function zxingDetector(): Promise<BarcodeDetectorLike> {
  const [{ BrowserMultiFormatReader }, { BarcodeFormat, ChecksumException, DecodeHintType, FormatException, NotFoundException }] =
    await Promise.all([import('@zxing/browser'), import('@zxing/library')]);
  // The label formats (LABEL_FORMATS), under the Shape Detection API's names.
  const names = new Map<number, string>([
    [BarcodeFormat.DATA_MATRIX, 'data_matrix'], [BarcodeFormat.CODE_128, 'code_128'], [BarcodeFormat.CODE_39, 'code_39'],
    [BarcodeFormat.QR_CODE, 'qr_code'], [BarcodeFormat.EAN_13, 'ean_13'], [BarcodeFormat.ITF, 'itf'],
  ]);
  const reader = new BrowserMultiFormatReader(new Map<number, unknown>([
    [DecodeHintType.POSSIBLE_FORMATS, [...names.keys()]],
    [DecodeHintType.TRY_HARDER, true],
  ]));
  const canvas = document.createElement('canvas');
  const context = canvas.getContext('2d', { willReadFrequently: true });
  return {
    detect(source: CanvasImageSource): Promise<DetectedBarcode[]> {
      const video = source as HTMLVideoElement;
      const [width, height] = [video.videoWidth, video.videoHeight];
      if (!context || !width || !height) return Promise.resolve([]);
      canvas.width = width;
      canvas.height = height;
      context.drawImage(video, 0, 0, width, height);
      try {
        const result = reader.decodeFromCanvas(canvas);
        return Promise.resolve([{ rawValue: result.getText(), format: names.get(result.getBarcodeFormat()) ?? 'unknown' }]);
      } catch (err) {
        // No code in this frame, or one not read whole: the camera looks again at the next frame.
        if (err instanceof NotFoundException || err instanceof ChecksumException || err instanceof FormatException) return Promise.resolve([]);
        return Promise.reject(err instanceof Error ? err : new Error(String(err)));
      }
    },
  };
}
