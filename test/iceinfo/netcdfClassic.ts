// A small writer of classic NetCDF files for the tests, after Unidata's "NetCDF Classic Format
// Specification" (the grammar in the NetCDF Users Guide): CDF-1 (classic, 32-bit offsets) and
// CDF-2 (64-bit offset). Big-endian throughout; names, attribute values and variable data padded
// to 4 bytes; no record dimension (numrecs 0). Enough to write the grids the readers must take.

/** nc_type codes of the specification. */
export const NC_TYPE = { byte: 1, char: 2, short: 3, int: 4, float: 5, double: 6 } as const;
export type NcType = keyof typeof NC_TYPE;
const SIZE: Record<NcType, number> = { byte: 1, char: 1, short: 2, int: 4, float: 4, double: 8 };

/** Tags of the header lists (NC_DIMENSION, NC_VARIABLE, NC_ATTRIBUTE). */
const TAG = { dimension: 0x0a, variable: 0x0b, attribute: 0x0c } as const;

export interface NcAttribute {
  name: string;
  type: NcType;
  /** Text for `char`, numbers otherwise. */
  value: string | readonly number[];
}

export interface NcVariable {
  name: string;
  /** Dimension names, slowest varying first. */
  dims: readonly string[];
  type: NcType;
  attrs?: readonly NcAttribute[];
  /** The values in file order; fewer than the shape holds only for a deliberately short file. */
  data: ArrayLike<number>;
  /** Overrides the declared size in bytes (a hostile file that lies about it). */
  vsize?: number;
}

export interface NcFile {
  /** 1: classic format; 2: 64-bit offset format. */
  version: 1 | 2;
  dims: readonly { name: string; size: number }[];
  attrs?: readonly NcAttribute[];
  vars: readonly NcVariable[];
}

const pad4 = (n: number) => (4 - (n % 4)) % 4;

class Out {
  private bytes: number[] = [];
  get length() {
    return this.bytes.length;
  }
  u8(...b: number[]) {
    this.bytes.push(...b);
  }
  int(n: number) {
    this.u8((n >>> 24) & 0xff, (n >>> 16) & 0xff, (n >>> 8) & 0xff, n & 0xff);
  }
  int64(n: number) {
    this.int(Math.floor(n / 2 ** 32));
    this.int(n >>> 0);
  }
  pad() {
    for (let i = pad4(this.bytes.length); i > 0; i--) this.u8(0);
  }
  name(s: string) {
    const b = new TextEncoder().encode(s);
    this.int(b.length);
    this.u8(...b);
    this.pad();
  }
  values(type: NcType, v: string | ArrayLike<number>) {
    if (typeof v === 'string') {
      this.u8(...new TextEncoder().encode(v));
      return;
    }
    const dv = new DataView(new ArrayBuffer(SIZE[type]));
    for (let i = 0; i < v.length; i++) {
      const x = v[i] as number;
      if (type === 'byte') dv.setInt8(0, x);
      else if (type === 'short') dv.setInt16(0, x);
      else if (type === 'int') dv.setInt32(0, x);
      else if (type === 'float') dv.setFloat32(0, x);
      else dv.setFloat64(0, x);
      this.u8(...new Uint8Array(dv.buffer));
    }
  }
  attrs(list: readonly NcAttribute[] | undefined) {
    if (!list || list.length === 0) {
      this.int(0);
      this.int(0);
      return;
    }
    this.int(TAG.attribute);
    this.int(list.length);
    for (const a of list) {
      this.name(a.name);
      this.int(NC_TYPE[a.type]);
      this.int(typeof a.value === 'string' ? new TextEncoder().encode(a.value).length : a.value.length);
      this.values(a.type, a.value);
      this.pad();
    }
  }
  done(): Uint8Array {
    return Uint8Array.from(this.bytes);
  }
}

/** The file's bytes: header, then each variable's data in order, each padded to 4 bytes. */
export function writeClassicNetcdf(f: NcFile): Uint8Array {
  const dimIndex = new Map(f.dims.map((d, i) => [d.name, i]));
  const sizeOf = (v: NcVariable) => {
    const n = v.dims.reduce((p, d) => p * (f.dims[dimIndex.get(d) as number]?.size ?? 0), 1) * SIZE[v.type];
    return n + pad4(n);
  };
  // The header is written twice: once to learn its length (the data offsets depend on it).
  const header = (begins: readonly number[]): Out => {
    const o = new Out();
    o.u8(0x43, 0x44, 0x46, f.version);
    o.int(0);
    if (f.dims.length === 0) {
      o.int(0);
      o.int(0);
    } else {
      o.int(TAG.dimension);
      o.int(f.dims.length);
      for (const d of f.dims) {
        o.name(d.name);
        o.int(d.size);
      }
    }
    o.attrs(f.attrs);
    o.int(TAG.variable);
    o.int(f.vars.length);
    f.vars.forEach((v, i) => {
      o.name(v.name);
      o.int(v.dims.length);
      for (const d of v.dims) {
        const k = dimIndex.get(d);
        if (k === undefined) throw new Error(`variable ${v.name} names an unknown dimension ${d}`);
        o.int(k);
      }
      o.attrs(v.attrs);
      o.int(NC_TYPE[v.type]);
      o.int(Math.min(v.vsize ?? sizeOf(v), 0xffffffff) >>> 0);
      if (f.version === 1) o.int(begins[i] ?? 0);
      else o.int64(begins[i] ?? 0);
    });
    return o;
  };
  const headerLength = header([]).length;
  const begins: number[] = [];
  let at = headerLength;
  for (const v of f.vars) {
    begins.push(at);
    const n = v.data.length * SIZE[v.type];
    at += n + pad4(n);
  }
  const out = header(begins);
  for (const v of f.vars) {
    out.values(v.type, v.data);
    out.pad();
  }
  return out.done();
}
