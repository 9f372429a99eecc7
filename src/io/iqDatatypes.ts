import { DspError } from '../dsp/errors';

/**
 * Complex sample encodings, named as SigMF names them (`c` complex, then type and width, then endianness; 8-bit types
 * take none — SigMF spec v1.2.x, core:datatype). `ci16_be` is not written into SigMF by Crestline but is one of the raw
 * formats. Integer types map full scale ±1.0 to ±(2^(b−1) − 1): round(x·32767) for int16, clipped to the type's range
 * (REFERENCE §9, common practice); cu8 is offset binary, x = (u − 127.5)/127.5 (common practice for 8-bit receivers,
 * from memory).
 */
export type IqDatatype = 'cf32_le' | 'cf64_le' | 'ci32_le' | 'ci16_le' | 'ci16_be' | 'ci8' | 'cu8';

export interface IqDatatypeInfo {
  readonly datatype: IqDatatype;
  /** Bytes of one component (I or Q); a complex sample takes twice this. */
  readonly bytesPerComponent: number;
  readonly kind: 'float' | 'int' | 'uint';
  readonly littleEndian: boolean;
  /** Integer code that represents +1.0 (full scale); 1 for floats. */
  readonly fullScaleCode: number;
  readonly minCode: number;
  readonly maxCode: number;
  /** Offset-binary zero (cu8: 127.5), else 0. */
  readonly zeroCode: number;
  readonly description: string;
}

const TABLE: Record<IqDatatype, IqDatatypeInfo> = {
  cf32_le: info('cf32_le', 4, 'float', true, 1, -Infinity, Infinity, 0, 'complex float32, little-endian'),
  cf64_le: info('cf64_le', 8, 'float', true, 1, -Infinity, Infinity, 0, 'complex float64, little-endian'),
  ci32_le: info('ci32_le', 4, 'int', true, 2147483647, -2147483648, 2147483647, 0, 'complex int32, little-endian'),
  ci16_le: info('ci16_le', 2, 'int', true, 32767, -32768, 32767, 0, 'complex int16, little-endian'),
  ci16_be: info('ci16_be', 2, 'int', false, 32767, -32768, 32767, 0, 'complex int16, big-endian'),
  ci8: info('ci8', 1, 'int', true, 127, -128, 127, 0, 'complex int8'),
  cu8: info('cu8', 1, 'uint', true, 127.5, 0, 255, 127.5, 'complex uint8, offset binary'),
};

function info(
  datatype: IqDatatype,
  bytesPerComponent: number,
  kind: IqDatatypeInfo['kind'],
  littleEndian: boolean,
  fullScaleCode: number,
  minCode: number,
  maxCode: number,
  zeroCode: number,
  description: string,
): IqDatatypeInfo {
  return { datatype, bytesPerComponent, kind, littleEndian, fullScaleCode, minCode, maxCode, zeroCode, description };
}

/** Every datatype Crestline reads. */
export const READABLE_DATATYPES: readonly IqDatatype[] = Object.keys(TABLE) as IqDatatype[];
/** Datatypes Crestline writes into SigMF recordings. */
export const SIGMF_WRITTEN_DATATYPES = ['cf32_le', 'ci16_le', 'ci8'] as const;

export function isIqDatatype(value: unknown): value is IqDatatype {
  return typeof value === 'string' && Object.hasOwn(TABLE, value);
}

export function datatypeInfo(datatype: IqDatatype): IqDatatypeInfo {
  return TABLE[datatype];
}

/** Bytes per complex sample. */
export function bytesPerSample(datatype: IqDatatype): number {
  return 2 * TABLE[datatype].bytesPerComponent;
}

/**
 * Checks that a data region of `byteLength` bytes holds a whole number of samples and returns that number.
 * @throws DspError INVALID_FILE (details.problem "length") naming the file, the byte count and the sample size
 */
export function samplesInBytes(datatype: IqDatatype, byteLength: number, sourceName: string): number {
  const size = bytesPerSample(datatype);
  if (byteLength % size !== 0) {
    throw new DspError(
      'INVALID_FILE',
      `${sourceName}: the data holds ${byteLength} bytes, which is not a whole number of ${datatype} samples (${size} bytes each; ${byteLength % size} bytes left over). The file is truncated or not ${datatype}.`,
      { problem: 'length', byteLength, bytesPerSample: size },
    );
  }
  return byteLength / size;
}
