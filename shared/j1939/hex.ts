import { accept, refuse, type Result } from './result';

const HEX_BYTES = /^(?:[0-9A-Fa-f]{2})*$/;

/** Hex text (2 digits a byte, either case) to bytes; refuses odd lengths and non-hex digits. */
export function hexToBytes(hex: string): Result<Uint8Array> {
  if (typeof hex !== 'string') return refuse('data is not a string');
  if (!HEX_BYTES.test(hex)) return refuse(`data "${hex}" is not whole bytes of hex`);
  const bytes = new Uint8Array(hex.length / 2);
  for (let i = 0; i < bytes.length; i++) bytes[i] = parseInt(hex.slice(2 * i, 2 * i + 2), 16);
  return accept(bytes);
}

/** Bytes to upper-case hex, 2 digits a byte, as the gateway protocol writes CAN data. */
export function bytesToHex(bytes: Uint8Array | readonly number[]): string {
  let out = '';
  for (const b of bytes) {
    if (!Number.isInteger(b) || b < 0 || b > 255) throw new RangeError(`byte ${b} is not an integer 0..255`);
    out += b.toString(16).toUpperCase().padStart(2, '0');
  }
  return out;
}
