// Packs a site's year-mode loss events into one bytea (and back): typed arrays laid end to end.
// Layout (little-endian): u32 events, u32 tankEntries, i32 year[events], f64 loss[events],
// i32 tankStart[events + 1], i32 tankIndex[tankEntries], f64 tankLoss[tankEntries].

export interface PackedEvents {
  year: Int32Array
  loss: Float64Array
  tankStart: Int32Array
  tankIndex: Int32Array
  tankLoss: Float64Array
}

const HEADER = 8

function padTo8(n: number): number {
  return (n + 7) & ~7
}

export function encodeEvents(e: PackedEvents): Buffer {
  const n = e.year.length
  const m = e.tankIndex.length
  if (e.loss.length !== n || e.tankStart.length !== n + 1 || e.tankLoss.length !== m) {
    throw new RangeError('inconsistent event table')
  }
  const yearBytes = padTo8(4 * n)
  const startBytes = padTo8(4 * (n + 1))
  const indexBytes = padTo8(4 * m)
  const size = HEADER + yearBytes + 8 * n + startBytes + indexBytes + 8 * m
  const buf = Buffer.alloc(size)
  buf.writeUInt32LE(n, 0)
  buf.writeUInt32LE(m, 4)
  let offset = HEADER
  const put = (arr: Int32Array | Float64Array, bytes: number) => {
    Buffer.from(arr.buffer, arr.byteOffset, arr.byteLength).copy(buf, offset)
    offset += bytes
  }
  put(e.year, yearBytes)
  put(e.loss, 8 * n)
  put(e.tankStart, startBytes)
  put(e.tankIndex, indexBytes)
  put(e.tankLoss, 8 * m)
  return buf
}

export function decodeEvents(buf: Buffer): PackedEvents {
  const n = buf.readUInt32LE(0)
  const m = buf.readUInt32LE(4)
  // Copy into an aligned buffer: typed arrays need their element alignment.
  const aligned = new ArrayBuffer(buf.length)
  new Uint8Array(aligned).set(buf)
  let offset = HEADER
  const take = <T>(make: (b: ArrayBuffer, o: number, len: number) => T, len: number, bytes: number): T => {
    const out = make(aligned, offset, len)
    offset += bytes
    return out
  }
  const year = take((b, o, l) => new Int32Array(b, o, l), n, padTo8(4 * n))
  const loss = take((b, o, l) => new Float64Array(b, o, l), n, 8 * n)
  const tankStart = take((b, o, l) => new Int32Array(b, o, l), n + 1, padTo8(4 * (n + 1)))
  const tankIndex = take((b, o, l) => new Int32Array(b, o, l), m, padTo8(4 * m))
  const tankLoss = take((b, o, l) => new Float64Array(b, o, l), m, 8 * m)
  return { year, loss, tankStart, tankIndex, tankLoss }
}
