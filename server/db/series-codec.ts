// How series are packed into binary columns. Times stay float64 (a BJD needs ~1e-8 d); relative
// fluxes and errors fit float32 (7 significant digits: 0.1 ppm near 1).

const MAGIC_LIGHT_CURVE = 0x4c43; // "LC"
const MAGIC_DISPLAY = 0x4453; // "DS"

export interface PackedLightCurve {
  timeDays: Float64Array;
  flux: Float64Array;
  fluxErr: Float64Array;
}

/** Layout: u16 magic, u16 version, u32 n, n × f64 time, n × f32 flux, n × f32 error (little-endian). */
export function packLightCurve(series: PackedLightCurve): Buffer {
  const n = series.timeDays.length;
  const buffer = Buffer.alloc(8 + n * 16);
  buffer.writeUInt16LE(MAGIC_LIGHT_CURVE, 0);
  buffer.writeUInt16LE(1, 2);
  buffer.writeUInt32LE(n, 4);
  for (let i = 0; i < n; i += 1) {
    buffer.writeDoubleLE(series.timeDays[i]!, 8 + i * 8);
    buffer.writeFloatLE(series.flux[i]!, 8 + n * 8 + i * 4);
    buffer.writeFloatLE(series.fluxErr[i]!, 8 + n * 12 + i * 4);
  }
  return buffer;
}

export function unpackLightCurve(packed: Buffer | Uint8Array): PackedLightCurve {
  const buffer = Buffer.from(packed.buffer, packed.byteOffset, packed.byteLength);
  if (buffer.readUInt16LE(0) !== MAGIC_LIGHT_CURVE) throw new Error('not a packed light curve');
  const n = buffer.readUInt32LE(4);
  const timeDays = new Float64Array(n);
  const flux = new Float64Array(n);
  const fluxErr = new Float64Array(n);
  for (let i = 0; i < n; i += 1) {
    timeDays[i] = buffer.readDoubleLE(8 + i * 8);
    flux[i] = buffer.readFloatLE(8 + n * 8 + i * 4);
    fluxErr[i] = buffer.readFloatLE(8 + n * 12 + i * 4);
  }
  return { timeDays, flux, fluxErr };
}

export interface PackedDisplay {
  /** Days since the snippet's start. */
  offsetDays: Float32Array;
  flux: Float32Array;
}

/** Layout: u16 magic, u16 version, u32 n, n × f32 offset from the snippet start (days), n × f32 flux. */
export function packDisplay(startDays: number, timeDays: ArrayLike<number>, flux: ArrayLike<number>): Buffer {
  const n = timeDays.length;
  const buffer = Buffer.alloc(8 + n * 8);
  buffer.writeUInt16LE(MAGIC_DISPLAY, 0);
  buffer.writeUInt16LE(1, 2);
  buffer.writeUInt32LE(n, 4);
  for (let i = 0; i < n; i += 1) {
    buffer.writeFloatLE(timeDays[i]! - startDays, 8 + i * 4);
    buffer.writeFloatLE(flux[i]!, 8 + n * 4 + i * 4);
  }
  return buffer;
}

export function unpackDisplay(packed: Buffer | Uint8Array): PackedDisplay {
  const buffer = Buffer.from(packed.buffer, packed.byteOffset, packed.byteLength);
  if (buffer.readUInt16LE(0) !== MAGIC_DISPLAY) throw new Error('not a packed display series');
  const n = buffer.readUInt32LE(4);
  const offsetDays = new Float32Array(n);
  const flux = new Float32Array(n);
  for (let i = 0; i < n; i += 1) {
    offsetDays[i] = buffer.readFloatLE(8 + i * 4);
    flux[i] = buffer.readFloatLE(8 + n * 4 + i * 4);
  }
  return { offsetDays, flux };
}
