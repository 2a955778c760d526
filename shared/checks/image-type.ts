// The type of an uploaded image from its first bytes, never from its name or the browser's claim.
// Signatures: JPEG starts with the SOI marker FF D8 and a further marker FF (ITU-T T.81 / ISO/IEC 10918-1);
// PNG with its 8-byte signature 89 50 4E 47 0D 0A 1A 0A (ISO/IEC 15948, PNG specification section 5.2);
// WebP is a RIFF container: "RIFF", a 4-byte size, then "WEBP" (the WebP container specification).

export type ImageType = 'image/jpeg' | 'image/png' | 'image/webp';

const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const ascii = (bytes: Uint8Array, at: number, text: string) => [...text].every((ch, i) => bytes[at + i] === ch.charCodeAt(0));

export function sniffImageType(bytes: Uint8Array): ImageType | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  if (bytes.length >= 8 && PNG.every((b, i) => bytes[i] === b)) return 'image/png';
  if (bytes.length >= 12 && ascii(bytes, 0, 'RIFF') && ascii(bytes, 8, 'WEBP')) return 'image/webp';
  return null;
}

export const IMAGE_EXTENSIONS: Record<ImageType, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' };
