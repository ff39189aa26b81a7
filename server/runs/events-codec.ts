// Packs a site's year-mode loss events into one bytea (and back): typed arrays laid end to end.
//
// Layout 2 (engine 2 and later; little-endian): u32 0xFFFFFFFF (marker), u32 2 (layout), u32 events,
// u32 tankEntries, i32 year[events], f64 loss[events], f64 propertyDamage[events],
// i32 tankStart[events + 1], i32 tankIndex[tankEntries], f64 tankLoss[tankEntries],
// f64 tankPropertyDamage[tankEntries], u8 tankBySpread[tankEntries]; each block padded to 8 bytes.
// Business interruption is loss − property damage (so PD + BI gives the loss up to rounding).
//
// Layout 1 (engine 1 runs, still stored): u32 events, u32 tankEntries, i32 year, f64 loss,
// i32 tankStart, i32 tankIndex, f64 tankLoss — no property / interruption split: decoded with
// `split: null` and shown as "total only".

export interface PackedEvents {
  year: Int32Array
  loss: Float64Array
  tankStart: Int32Array
  tankIndex: Int32Array
  tankLoss: Float64Array
}

/** The property-damage part of each event and tank entry, and which tanks burned by spread. */
export interface PackedSplit {
  propertyDamage: Float64Array
  tankPropertyDamage: Float64Array
  tankBySpread: Uint8Array
}

export interface DecodedEvents extends PackedEvents {
  /** null for events stored before the split (engine 1): total only. */
  split: PackedSplit | null
}

const MARKER = 0xFFFFFFFF
const LAYOUT = 2

function padTo8(n: number): number {
  return (n + 7) & ~7
}

export function encodeEvents(e: PackedEvents & { split: PackedSplit }): Buffer {
  const n = e.year.length
  const m = e.tankIndex.length
  if (e.loss.length !== n || e.tankStart.length !== n + 1 || e.tankLoss.length !== m
    || e.split.propertyDamage.length !== n || e.split.tankPropertyDamage.length !== m || e.split.tankBySpread.length !== m) {
    throw new RangeError('inconsistent event table')
  }
  const header = 16
  const size = header + padTo8(4 * n) + 16 * n + padTo8(4 * (n + 1)) + padTo8(4 * m) + 16 * m + padTo8(m)
  const buf = Buffer.alloc(size)
  buf.writeUInt32LE(MARKER, 0)
  buf.writeUInt32LE(LAYOUT, 4)
  buf.writeUInt32LE(n, 8)
  buf.writeUInt32LE(m, 12)
  let offset = header
  const put = (arr: Int32Array | Float64Array | Uint8Array) => {
    Buffer.from(arr.buffer, arr.byteOffset, arr.byteLength).copy(buf, offset)
    offset += padTo8(arr.byteLength)
  }
  put(e.year)
  put(e.loss)
  put(e.split.propertyDamage)
  put(e.tankStart)
  put(e.tankIndex)
  put(e.tankLoss)
  put(e.split.tankPropertyDamage)
  put(e.split.tankBySpread)
  return buf
}

export function decodeEvents(buf: Buffer): DecodedEvents {
  const layout2 = buf.length >= 16 && buf.readUInt32LE(0) === MARKER
  if (layout2 && buf.readUInt32LE(4) !== LAYOUT) throw new RangeError(`unknown event layout ${buf.readUInt32LE(4)}`)
  const n = buf.readUInt32LE(layout2 ? 8 : 0)
  const m = buf.readUInt32LE(layout2 ? 12 : 4)
  // Copy into an aligned buffer: typed arrays need their element alignment.
  const aligned = new ArrayBuffer(buf.length)
  new Uint8Array(aligned).set(buf)
  let offset = layout2 ? 16 : 8
  const i32 = (len: number) => { const a = new Int32Array(aligned, offset, len); offset += padTo8(4 * len); return a }
  const f64 = (len: number) => { const a = new Float64Array(aligned, offset, len); offset += 8 * len; return a }
  const u8 = (len: number) => { const a = new Uint8Array(aligned, offset, len); offset += padTo8(len); return a }
  const year = i32(n)
  const loss = f64(n)
  const propertyDamage = layout2 ? f64(n) : null
  const tankStart = i32(n + 1)
  const tankIndex = i32(m)
  const tankLoss = f64(m)
  if (!layout2 || propertyDamage === null) return { year, loss, tankStart, tankIndex, tankLoss, split: null }
  const tankPropertyDamage = f64(m)
  const tankBySpread = u8(m)
  return { year, loss, tankStart, tankIndex, tankLoss, split: { propertyDamage, tankPropertyDamage, tankBySpread } }
}

/** Business interruption of each event (loss − property damage), or null for a total-only table. */
export function eventBusinessInterruption(e: DecodedEvents): Float64Array | null {
  if (e.split === null) return null
  const out = new Float64Array(e.loss.length)
  for (let k = 0; k < out.length; k++) out[k] = e.loss[k]! - e.split.propertyDamage[k]!
  return out
}
