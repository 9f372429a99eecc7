import { describe, expect, it } from 'vitest';
import { encodeSigmfArchive, findSigmfRecording, sigmfArchiveNames } from '../../src/io/sigmfArchive';
import { encodeUstarArchive, encodeUstarHeader, listUstarMembers, USTAR_BLOCK_BYTES } from '../../src/io/ustar';
import { dspErrorOf } from '../helpers/dspErrorOf';

const inMemory = (bytes: Uint8Array) => (offset: number, length: number) => bytes.subarray(offset, offset + length);
const ascii = (bytes: Uint8Array, from: number, length: number) => String.fromCharCode(...bytes.subarray(from, from + length));

describe('ustar writer and reader (src/io/ustar.ts)', () => {
  it('writes the header fields where the ustar layout puts them, with a checksum summed here independently', () => {
    const h = encodeUstarHeader({ name: 'rec/rec.sigmf-data', type: 'file', sizeBytes: 1000, mtimeS: 0o1234567 });
    expect(h.length).toBe(512);
    // POSIX ustar header layout (common practice): name at 0, size at 124 (11 octal digits + NUL), mtime at 136,
    // typeflag at 156 ('0' regular file), magic "ustar\0" at 257, version "00" at 263.
    expect(ascii(h, 0, 18)).toBe('rec/rec.sigmf-data');
    expect(h[18]).toBe(0);
    expect(ascii(h, 124, 12)).toBe('00000001750\0'); // 1000 = 0o1750
    expect(ascii(h, 136, 12)).toBe('00001234567\0');
    expect(ascii(h, 156, 1)).toBe('0');
    expect(ascii(h, 257, 8)).toBe('ustar\u000000');
    // Checksum (POSIX ustar, common practice): unsigned byte sum with the 8-byte chksum field (148…155) read as
    // spaces, stored as 6 octal digits, NUL, space. Summed here without the module's helper.
    let sum = 8 * 0x20;
    h.forEach((b, i) => {
      if (i < 148 || i >= 156) sum += b;
    });
    expect(ascii(h, 148, 8)).toBe(`${sum.toString(8).padStart(6, '0')}\0 `);
    const dir = encodeUstarHeader({ name: 'rec/', type: 'directory', sizeBytes: 0 });
    expect(ascii(dir, 156, 1)).toBe('5'); // '5' directory (POSIX ustar, common practice)
  });

  it('round trip: members, sizes and data offsets on 512-byte blocks, ended by two zero blocks', () => {
    const a = new Uint8Array(700).map((_, i) => i % 251);
    const b = new TextEncoder().encode('{"global":{}}');
    const tar = encodeUstarArchive([
      { name: 'd/', type: 'directory' },
      { name: 'd/a.bin', type: 'file', bytes: a },
      { name: 'd/b.json', type: 'file', bytes: b },
    ]);
    // 3 headers + 700 bytes padded to 1024 + 13 padded to 512 + 2 end blocks = 512·(3 + 2 + 1 + 2) bytes.
    expect(tar.length).toBe(USTAR_BLOCK_BYTES * 8);
    expect(tar.subarray(tar.length - 1024).every((x) => x === 0)).toBe(true);
    const members = listUstarMembers(tar.length, inMemory(tar), 't.tar');
    expect(members.map((m) => [m.name, m.type, m.sizeBytes, m.dataOffsetBytes])).toEqual([
      ['d', 'directory', 0, 512],
      ['d/a.bin', 'file', 700, 1024],
      ['d/b.json', 'file', 13, 2048 + 512],
    ]);
    expect(tar.subarray(1024, 1024 + 700)).toEqual(a);
  });

  it('refuses a corrupted header, a truncated archive, names over 100 bytes and member types it does not read', () => {
    const tar = encodeUstarArchive([{ name: 'x.bin', type: 'file', bytes: new Uint8Array(600) }]);
    const flipped = tar.slice();
    flipped[3] = flipped[3]! ^ 0x01;
    const bad = dspErrorOf(() => listUstarMembers(flipped.length, inMemory(flipped), 'bad.sigmf'));
    expect(bad.message).toMatch(/^bad\.sigmf: tar header at byte 0 has checksum \d+ but its bytes sum to \d+: the archive is corrupted\.$/);
    expect(bad.details).toMatchObject({ problem: 'checksum' });

    const cut = tar.subarray(0, 1024);
    expect(dspErrorOf(() => listUstarMembers(cut.length, inMemory(cut), 'cut.sigmf')).message).toMatch(/member "x\.bin" needs 600 bytes but the archive ends after 512: the file is truncated/);
    const noEnd = tar.subarray(0, 1536);
    expect(dspErrorOf(() => listUstarMembers(noEnd.length, inMemory(noEnd), 'e.sigmf')).details).toMatchObject({ problem: 'truncated' });

    // ustar name field: 100 bytes (POSIX ustar header layout, common practice); the prefix field is not written here.
    expect(() => encodeUstarHeader({ name: 'n'.repeat(100), type: 'file', sizeBytes: 0 })).not.toThrow();
    expect(dspErrorOf(() => encodeUstarHeader({ name: 'n'.repeat(101), type: 'file', sizeBytes: 0 })).message).toMatch(/is 101 bytes; ustar names here are 1 to 100 bytes/);
    expect(dspErrorOf(() => encodeUstarHeader({ name: 'big', type: 'file', sizeBytes: 8 ** 11 })).message).toMatch(/a file holds 0 to 8589934591 bytes/);

    // A symbolic link ('2', POSIX ustar typeflag, common practice), re-checksummed so only the type is wrong.
    const link = tar.slice();
    link[156] = 0x32;
    const h = link.subarray(0, 512);
    let sum = 8 * 0x20;
    h.forEach((b, i) => {
      if (i < 148 || i >= 156) sum += b;
    });
    h.set(new TextEncoder().encode(`${sum.toString(8).padStart(6, '0')}\0 `), 148);
    expect(dspErrorOf(() => listUstarMembers(link.length, inMemory(link), 'l.sigmf')).message).toMatch(/has type "2"; only regular files \("0"\) and directories \("5"\) are supported/);
  });
});

describe('SigMF archive layout (src/io/sigmfArchive.ts)', () => {
  it('names the members N/, N/N.sigmf-meta and N/N.sigmf-data and finds the Recording again', () => {
    // SigMF spec 1.x, Archive section: for a Recording N, the directory N, N/N.sigmf-meta and N/N.sigmf-data; the
    // archive's own extension is .sigmf (the 1.2.x rules keep tar and .sigmf and require meta and data side by side).
    expect(sigmfArchiveNames('lte-5mhz')).toEqual({ directory: 'lte-5mhz/', meta: 'lte-5mhz/lte-5mhz.sigmf-meta', data: 'lte-5mhz/lte-5mhz.sigmf-data' });
    const tar = encodeSigmfArchive('rec', '{"global":{}}', new Uint8Array(16));
    const members = listUstarMembers(tar.length, inMemory(tar), 'rec.sigmf');
    expect(members.map((m) => m.name)).toEqual(['rec', 'rec/rec.sigmf-data', 'rec/rec.sigmf-meta']);
    const found = findSigmfRecording(members, 'rec.sigmf');
    expect([found.meta.name, found.data.name, found.data.sizeBytes]).toEqual(['rec/rec.sigmf-meta', 'rec/rec.sigmf-data', 16]);
  });

  it('refuses names that do not fit a ustar name or hold folders, and archives without exactly one Recording', () => {
    // 44 + 1 + 44 + 11 = 100 bytes fits; 45 does not (ustar name field, 100 bytes).
    expect(() => sigmfArchiveNames('a'.repeat(44))).not.toThrow();
    expect(dspErrorOf(() => sigmfArchiveNames('a'.repeat(45))).message).toMatch(/would be 102 bytes and tar names here are at most 100/);
    expect(dspErrorOf(() => sigmfArchiveNames('dir/rec')).message).toMatch(/must be a plain file name/);
    const onlyMeta = encodeUstarArchive([{ name: 'r/r.sigmf-meta', type: 'file', bytes: new Uint8Array(2) }]);
    const none = dspErrorOf(() => findSigmfRecording(listUstarMembers(onlyMeta.length, inMemory(onlyMeta), 'o.sigmf'), 'o.sigmf'));
    expect(none.message).toMatch(/^o\.sigmf: holds no SigMF Recording .*found r\/r\.sigmf-meta\.$/);
    const two = encodeUstarArchive(
      ['a/a.sigmf-meta', 'a/a.sigmf-data', 'b/b.sigmf-meta', 'b/b.sigmf-data'].map((name) => ({ name, type: 'file' as const, bytes: new Uint8Array(1) })),
    );
    expect(dspErrorOf(() => findSigmfRecording(listUstarMembers(two.length, inMemory(two), 't.sigmf'), 't.sigmf')).message).toMatch(/holds 2 Recordings/);
  });
});
