// SHA-256 (FIPS 180-4) fed chunk by chunk, so a file's hash is taken while it streams through the reader and the
// whole file is never held in memory. WebCrypto's digest is one-shot; Node callers may pass their own hasher.

export interface Hasher {
  update(bytes: Uint8Array): void;
  /** Lower-case hex digest; the hasher is spent afterwards. */
  digest(): string;
}

const K = new Int32Array([
  0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5, 0xd807aa98,
  0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786,
  0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8,
  0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13,
  0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819,
  0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a,
  0x5b9cca4f, 0x682e6ff3, 0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7,
  0xc67178f2,
]);

/** SHA-256 after FIPS 180-4 §6.2. */
export function sha256(): Hasher {
  const h = new Int32Array([
    0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19,
  ]);
  const block = new Uint8Array(64);
  let fill = 0;
  let total = 0;

  // Int32 arithmetic throughout (| 0): V8 keeps it in registers; the digest reads the words back unsigned.
  const w = new Int32Array(64);
  const compress = (b: Uint8Array, at: number): void => {
    for (let i = 0; i < 16; i++) {
      const j = at + i * 4;
      w[i] =
        ((b[j] as number) << 24) |
        ((b[j + 1] as number) << 16) |
        ((b[j + 2] as number) << 8) |
        (b[j + 3] as number);
    }
    for (let i = 16; i < 64; i++) {
      const a = w[i - 15] as number;
      const c = w[i - 2] as number;
      const s0 = ((a >>> 7) | (a << 25)) ^ ((a >>> 18) | (a << 14)) ^ (a >>> 3);
      const s1 = ((c >>> 17) | (c << 15)) ^ ((c >>> 19) | (c << 13)) ^ (c >>> 10);
      w[i] = ((w[i - 16] as number) + s0 + (w[i - 7] as number) + s1) | 0;
    }
    let a = h[0] as number,
      bb = h[1] as number,
      c = h[2] as number,
      d = h[3] as number,
      e = h[4] as number,
      f = h[5] as number,
      g = h[6] as number,
      hh = h[7] as number;
    for (let i = 0; i < 64; i++) {
      const S1 = ((e >>> 6) | (e << 26)) ^ ((e >>> 11) | (e << 21)) ^ ((e >>> 25) | (e << 7));
      const ch = (e & f) ^ (~e & g);
      const t1 = (hh + S1 + ch + (K[i] as number) + (w[i] as number)) | 0;
      const S0 = ((a >>> 2) | (a << 30)) ^ ((a >>> 13) | (a << 19)) ^ ((a >>> 22) | (a << 10));
      const maj = (a & bb) ^ (a & c) ^ (bb & c);
      const t2 = (S0 + maj) | 0;
      hh = g;
      g = f;
      f = e;
      e = (d + t1) | 0;
      d = c;
      c = bb;
      bb = a;
      a = (t1 + t2) | 0;
    }
    h[0] = ((h[0] as number) + a) | 0;
    h[1] = ((h[1] as number) + bb) | 0;
    h[2] = ((h[2] as number) + c) | 0;
    h[3] = ((h[3] as number) + d) | 0;
    h[4] = ((h[4] as number) + e) | 0;
    h[5] = ((h[5] as number) + f) | 0;
    h[6] = ((h[6] as number) + g) | 0;
    h[7] = ((h[7] as number) + hh) | 0;
  };

  return {
    update(bytes) {
      total += bytes.length;
      let i = 0;
      if (fill > 0) {
        const take = Math.min(64 - fill, bytes.length);
        block.set(bytes.subarray(0, take), fill);
        fill += take;
        i = take;
        if (fill < 64) return;
        compress(block, 0);
        fill = 0;
      }
      for (; i + 64 <= bytes.length; i += 64) compress(bytes, i);
      if (i < bytes.length) {
        block.set(bytes.subarray(i), 0);
        fill = bytes.length - i;
      }
    },
    digest() {
      const bits = total * 8;
      const pad = new Uint8Array((fill < 56 ? 56 : 120) - fill + 8);
      pad[0] = 0x80;
      const hi = Math.floor(bits / 2 ** 32);
      const lo = bits >>> 0;
      const n = pad.length;
      pad[n - 8] = hi >>> 24;
      pad[n - 7] = (hi >>> 16) & 0xff;
      pad[n - 6] = (hi >>> 8) & 0xff;
      pad[n - 5] = hi & 0xff;
      pad[n - 4] = lo >>> 24;
      pad[n - 3] = (lo >>> 16) & 0xff;
      pad[n - 2] = (lo >>> 8) & 0xff;
      pad[n - 1] = lo & 0xff;
      const saved = total;
      this.update(pad);
      total = saved;
      return Array.from(h, (x) => (x >>> 0).toString(16).padStart(8, '0')).join('');
    },
  };
}
