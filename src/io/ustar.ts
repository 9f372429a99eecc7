import { DspError } from '../dsp/errors';

/**
 * A small POSIX ustar (tar) writer and reader, enough for SigMF archives: regular files and directories, names of at
 * most 100 bytes (the `name` field; a reader also joins a `prefix`), sizes below 8 GiB (11 octal digits). Layout
 * (POSIX.1-1988 ustar header, kept by POSIX.1-2001 pax; field offsets from memory, common practice):
 *
 * | offset | size | field    | | offset | size | field    |
 * |---|---|---|---|---|---|---|
 * | 0   | 100 | name      | | 257 | 6   | magic "ustar\0" |
 * | 100 | 8   | mode      | | 263 | 2   | version "00" |
 * | 108 | 8   | uid       | | 265 | 32  | uname    |
 * | 116 | 8   | gid       | | 297 | 32  | gname    |
 * | 124 | 12  | size      | | 329 | 8   | devmajor |
 * | 136 | 12  | mtime     | | 337 | 8   | devminor |
 * | 148 | 8   | chksum    | | 345 | 155 | prefix   |
 * | 156 | 1   | typeflag  | | 500 | 12  | (pad)    |
 * | 157 | 100 | linkname  | |     |     |          |
 *
 * Numbers are octal ASCII ended by NUL. The checksum is the sum of the 512 header bytes as unsigned values with the
 * chksum field counted as eight spaces, written as six octal digits, NUL, space. Each member's data follows its header,
 * padded with zeros to a 512-byte boundary; two zero blocks end the archive. Anything else (links, pax or GNU extension
 * headers, base-256 sizes) is refused with a message, not skipped.
 */
export const USTAR_BLOCK_BYTES = 512;
export const USTAR_MAX_NAME_BYTES = 100;
/** Largest member size 11 octal digits hold: 8^11 − 1 bytes (8 GiB − 1). */
export const USTAR_MAX_SIZE_BYTES = 8 ** 11 - 1;

export type UstarMemberType = 'file' | 'directory';

export interface UstarHeaderInput {
  readonly name: string;
  readonly type: UstarMemberType;
  readonly sizeBytes: number;
  /** Modification time, whole seconds since 1970 (0 gives reproducible archives). */
  readonly mtimeS?: number | undefined;
}

/** One member found by `listUstarMembers`: its data is `sizeBytes` bytes from `dataOffsetBytes` of the archive. */
export interface UstarMember {
  readonly name: string;
  readonly type: UstarMemberType;
  readonly sizeBytes: number;
  readonly dataOffsetBytes: number;
}

const encoder = new TextEncoder();

/**
 * Builds the 512-byte ustar header of one member.
 * @throws DspError INVALID_CONFIG when the name is empty or longer than 100 bytes (UTF-8), or the size is not a whole
 *   number of bytes below 8 GiB; a directory must have size 0
 */
export function encodeUstarHeader(input: UstarHeaderInput): Uint8Array {
  const nameBytes = encoder.encode(input.name);
  if (nameBytes.length === 0 || nameBytes.length > USTAR_MAX_NAME_BYTES) {
    throw new DspError('INVALID_CONFIG', `tar member name "${input.name}" is ${nameBytes.length} bytes; ustar names here are 1 to ${USTAR_MAX_NAME_BYTES} bytes.`, {
      field: 'name',
    });
  }
  const size = input.sizeBytes;
  if (!Number.isInteger(size) || size < 0 || size > USTAR_MAX_SIZE_BYTES || (input.type === 'directory' && size !== 0)) {
    throw new DspError('INVALID_CONFIG', `tar member "${input.name}": size ${size} bytes is not allowed; a file holds 0 to ${USTAR_MAX_SIZE_BYTES} bytes, a directory 0.`, {
      field: 'size',
    });
  }
  const h = new Uint8Array(USTAR_BLOCK_BYTES);
  h.set(nameBytes, 0);
  writeOctal(h, 100, 8, input.type === 'directory' ? 0o755 : 0o644);
  writeOctal(h, 108, 8, 0);
  writeOctal(h, 116, 8, 0);
  writeOctal(h, 124, 12, size);
  writeOctal(h, 136, 12, Math.max(0, Math.floor(input.mtimeS ?? 0)));
  h[156] = input.type === 'directory' ? 0x35 : 0x30; // '5' directory, '0' regular file
  h.set(encoder.encode('ustar\0'), 257);
  h.set(encoder.encode('00'), 263);
  writeOctal(h, 148, 7, ustarChecksum(h));
  h[155] = 0x20;
  return h;
}

/** Sum of the header's bytes (unsigned) with the chksum field (148…155) counted as eight spaces. */
export function ustarChecksum(header: Uint8Array): number {
  let sum = 0;
  for (let i = 0; i < USTAR_BLOCK_BYTES; i++) sum += i >= 148 && i < 156 ? 0x20 : header[i]!;
  return sum;
}

/** Zero bytes that pad `sizeBytes` of member data to a whole block. */
export function ustarPaddingBytes(sizeBytes: number): number {
  return (USTAR_BLOCK_BYTES - (sizeBytes % USTAR_BLOCK_BYTES)) % USTAR_BLOCK_BYTES;
}

/** The end of an archive: two zero blocks. */
export function ustarEndBlocks(): Uint8Array {
  return new Uint8Array(2 * USTAR_BLOCK_BYTES);
}

/** An archive of `members` in memory (directories take no bytes). */
export function encodeUstarArchive(members: readonly { name: string; type: UstarMemberType; bytes?: Uint8Array }[], mtimeS = 0): Uint8Array {
  let total = 2 * USTAR_BLOCK_BYTES;
  for (const m of members) {
    const n = m.bytes?.length ?? 0;
    total += USTAR_BLOCK_BYTES + n + ustarPaddingBytes(n);
  }
  const out = new Uint8Array(total);
  let o = 0;
  for (const m of members) {
    const bytes = m.bytes ?? new Uint8Array(0);
    out.set(encodeUstarHeader({ name: m.name, type: m.type, sizeBytes: bytes.length, mtimeS }), o);
    o += USTAR_BLOCK_BYTES;
    out.set(bytes, o);
    o += bytes.length + ustarPaddingBytes(bytes.length);
  }
  return out;
}

/**
 * Lists the members of a ustar archive of `archiveBytes` bytes, reading only headers through `readAt` (bytes in
 * memory or a file's). Stops at the first zero block.
 * @throws DspError INVALID_FILE naming `archiveName` and the byte offset: a bad checksum ("checksum"), not ustar, an
 *   unsupported member type or size field ("unsupported"), a member or header running past the end ("truncated")
 */
export function listUstarMembers(archiveBytes: number, readAt: (offsetBytes: number, lengthBytes: number) => Uint8Array, archiveName: string): UstarMember[] {
  const members: UstarMember[] = [];
  let offset = 0;
  for (;;) {
    if (offset + USTAR_BLOCK_BYTES > archiveBytes) {
      throw new DspError('INVALID_FILE', `${archiveName}: the tar archive ends at byte ${archiveBytes} without its end-of-archive blocks: the file is truncated.`, {
        problem: 'truncated',
      });
    }
    const block = readAt(offset, USTAR_BLOCK_BYTES);
    if (block.every((b) => b === 0)) return members;
    const member = parseUstarHeader(block, archiveName, offset);
    const end = offset + USTAR_BLOCK_BYTES + member.sizeBytes;
    if (end > archiveBytes) {
      throw new DspError('INVALID_FILE', `${archiveName}: member "${member.name}" needs ${member.sizeBytes} bytes but the archive ends after ${archiveBytes - offset - USTAR_BLOCK_BYTES}: the file is truncated.`, {
        problem: 'truncated',
      });
    }
    members.push({ ...member, dataOffsetBytes: offset + USTAR_BLOCK_BYTES });
    offset = end + ustarPaddingBytes(member.sizeBytes);
  }
}

const decoder = new TextDecoder('utf-8', { fatal: false });

/** Parses one header block found at `offsetBytes` (for messages). */
export function parseUstarHeader(block: Uint8Array, archiveName: string, offsetBytes: number): Omit<UstarMember, 'dataOffsetBytes'> {
  const where = `${archiveName}: tar header at byte ${offsetBytes}`;
  const fail = (problem: string, text: string): DspError => new DspError('INVALID_FILE', `${where} ${text}`, { problem, offsetBytes });
  if (block.length !== USTAR_BLOCK_BYTES) throw fail('truncated', `is ${block.length} bytes, not ${USTAR_BLOCK_BYTES}.`);
  const magic = decoder.decode(block.subarray(257, 263));
  if (magic !== 'ustar\0' && magic !== 'ustar ') throw fail('unsupported', 'is not a POSIX ustar header (no "ustar" magic); only ustar archives are read.');
  const stored = readOctal(block, 148, 8);
  if (stored === undefined || stored !== ustarChecksum(block)) {
    throw fail('checksum', `has checksum ${stored ?? 'unreadable'} but its bytes sum to ${ustarChecksum(block)}: the archive is corrupted.`);
  }
  const name = joinName(cString(block, 345, 155), cString(block, 0, 100));
  const flag = String.fromCharCode(block[156]!);
  let type: UstarMemberType;
  if (flag === '0' || flag === '\0') type = 'file';
  else if (flag === '5') type = 'directory';
  else throw fail('unsupported', `("${name}") has type "${flag}"; only regular files ("0") and directories ("5") are supported (no links, pax or GNU extension headers).`);
  if ((block[124]! & 0x80) !== 0) throw fail('unsupported', `("${name}") uses a base-256 size (over 8 GiB); not supported.`);
  const sizeBytes = readOctal(block, 124, 12);
  if (sizeBytes === undefined) throw fail('unsupported', `("${name}") has an unreadable size field.`);
  return { name, type, sizeBytes: type === 'directory' ? 0 : sizeBytes };
}

function writeOctal(h: Uint8Array, offset: number, width: number, value: number): void {
  // width − 1 octal digits, zero-padded, then NUL.
  const text = value.toString(8).padStart(width - 1, '0');
  h.set(encoder.encode(text), offset);
  h[offset + width - 1] = 0;
}

function readOctal(h: Uint8Array, offset: number, width: number): number | undefined {
  const text = decoder.decode(h.subarray(offset, offset + width)).replace(/[\0 ]+$/, '').replace(/^ +/, '');
  if (!/^[0-7]+$/.test(text)) return undefined;
  return parseInt(text, 8);
}

function cString(h: Uint8Array, offset: number, width: number): string {
  const field = h.subarray(offset, offset + width);
  const end = field.indexOf(0);
  return decoder.decode(end < 0 ? field : field.subarray(0, end));
}

function joinName(prefix: string, name: string): string {
  const joined = prefix === '' ? name : `${prefix}/${name}`;
  return joined.replace(/^\.\//, '').replace(/\/$/, '');
}
