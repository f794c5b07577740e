import {
  BarcodeFormat, BinaryBitmap, ChecksumException, DataMatrixReader, DecodeHintType, FormatException, HybridBinarizer,
  MultiFormatOneDReader, NotFoundException, QRCodeReader, RGBLuminanceSource, type Reader, type Result,
} from '@zxing/library';

/**
 * ZXing's decoders off the main thread: a decode of a camera frame takes tens of milliseconds (about 26
 * on this project's build machine, more on a tablet), and a tap on the pad must never wait for one.
 * Takes RGBA frames, answers `{ id, found }` with the code read, or null.
 */
export type FrameRequest = { id: number; width: number; height: number; rgba: ArrayBuffer };
export type FrameAnswer = { id: number; found: { rawValue: string; format: string } | null; error?: string };

// The label formats (LABEL_FORMATS), under the Shape Detection API's names.
const names = new Map<BarcodeFormat, string>([
  [BarcodeFormat.DATA_MATRIX, 'data_matrix'], [BarcodeFormat.CODE_128, 'code_128'], [BarcodeFormat.CODE_39, 'code_39'],
  [BarcodeFormat.QR_CODE, 'qr_code'], [BarcodeFormat.EAN_13, 'ean_13'], [BarcodeFormat.ITF, 'itf'],
]);
const hints = new Map<DecodeHintType, unknown>([[DecodeHintType.POSSIBLE_FORMATS, [...names.keys()]], [DecodeHintType.TRY_HARDER, true]]);
// The readers of those formats, tried in turn (ZXing's MultiFormatReader does the same, but writes a
// console warning for every frame without a code).
const readers: Reader[] = [new DataMatrixReader(), new MultiFormatOneDReader(hints), new QRCodeReader()];
const notRead = (err: unknown) => err instanceof NotFoundException || err instanceof ChecksumException || err instanceof FormatException;

function decode(bitmap: BinaryBitmap): Result | null {
  for (const reader of readers) {
    try {
      return reader.decode(bitmap, hints);
    } catch (err) {
      if (!notRead(err)) throw err;
    } finally {
      reader.reset();
    }
  }
  return null;
}

/** ITU-R BT.601 luma of each RGBA pixel (the weights ZXing's own canvas source uses, ×1000). */
function lumaOf(rgba: Uint8ClampedArray, size: number): Uint8ClampedArray {
  const luma = new Uint8ClampedArray(size);
  for (let i = 0, p = 0; i < size; i++, p += 4) luma[i] = (rgba[p]! * 299 + rgba[p + 1]! * 587 + rgba[p + 2]! * 114) / 1000;
  return luma;
}

const scope = self as unknown as { onmessage: ((e: MessageEvent<FrameRequest>) => void) | null; postMessage(answer: FrameAnswer): void };
scope.onmessage = ({ data: { id, width, height, rgba } }) => {
  try {
    const source = new RGBLuminanceSource(lumaOf(new Uint8ClampedArray(rgba), width * height), width, height);
    const result = decode(new BinaryBitmap(new HybridBinarizer(source)));
    // No code in this frame, or one not read whole: the camera looks again at the next frame.
    scope.postMessage({ id, found: result ? { rawValue: result.getText(), format: names.get(result.getBarcodeFormat()) ?? 'unknown' } : null });
  } catch (err) {
    scope.postMessage({ id, found: null, error: err instanceof Error ? err.message : String(err) });
  }
};
