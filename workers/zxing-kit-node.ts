// The same zxing classes for Node (tests and the bench): the package's CommonJS entry, since its ES module files
// are not marked as modules for Node.
import {
  BarcodeFormat,
  BinaryBitmap,
  Code128Reader,
  Code39Reader,
  DataMatrixReader,
  DecodeHintType,
  HybridBinarizer,
  QRCodeReader,
  RGBLuminanceSource,
} from '@zxing/library';
import type { ZxingKit } from './tag-decode-core.js';

export const zxingKitNode: ZxingKit = {
  BarcodeFormat,
  BinaryBitmap,
  DecodeHintType,
  RGBLuminanceSource,
  HybridBinarizer,
  DataMatrixReader,
  Code128Reader,
  Code39Reader,
  QRCodeReader,
} as unknown as ZxingKit;
