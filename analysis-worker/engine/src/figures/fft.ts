/**
 * A small iterative radix-2 FFT (Cooley-Tukey) and the harmonic content of one period of a
 * uniformly sampled waveform: amplitudes per harmonic and total harmonic distortion.
 */

/** In-place forward FFT of (re, im); the length must be a power of two. */
export function fftRadix2(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  if (n !== im.length || (n & (n - 1)) !== 0)
    throw new Error(`FFT length ${n} is not a power of two`);
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      [re[i], re[j]] = [re[j]!, re[i]!];
      [im[i], im[j]] = [im[j]!, im[i]!];
    }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const ang = (-2 * Math.PI) / len;
    const wr = Math.cos(ang);
    const wi = Math.sin(ang);
    for (let i = 0; i < n; i += len) {
      let cr = 1;
      let ci = 0;
      for (let k = 0; k < len / 2; k++) {
        const a = i + k;
        const b = a + len / 2;
        const tr = re[b]! * cr - im[b]! * ci;
        const ti = re[b]! * ci + im[b]! * cr;
        re[b] = re[a]! - tr;
        im[b] = im[a]! - ti;
        re[a]! += tr;
        im[a]! += ti;
        const ncr = cr * wr - ci * wi;
        ci = cr * wi + ci * wr;
        cr = ncr;
      }
    }
  }
}

/** Peak amplitude of harmonics 0 .. n/2-1 of one period given as n uniform samples (n a power of two). */
export function harmonicAmplitudes(samples: ArrayLike<number>): Float64Array {
  const n = samples.length;
  const re = Float64Array.from(samples);
  const im = new Float64Array(n);
  fftRadix2(re, im);
  const out = new Float64Array(n / 2);
  out[0] = Math.abs(re[0]!) / n;
  for (let h = 1; h < n / 2; h++) out[h] = (2 * Math.hypot(re[h]!, im[h]!)) / n;
  return out;
}

/**
 * THD = sqrt(sum of harmonics 2.. squared) / fundamental; null when there is no fundamental.
 * `cycles` mains cycles in the window (a subharmonic orbit): the fundamental is then bin
 * `cycles` and the harmonics its multiples; the content between them is not harmonic distortion.
 */
export function thdFromSamples(samples: ArrayLike<number>, cycles = 1): number | null {
  const a = harmonicAmplitudes(samples);
  const fundamental = a[cycles]!;
  let total = 0;
  let sumSq = 0;
  for (let h = cycles; h < a.length; h += cycles) total += a[h]! * a[h]!;
  for (let h = 2 * cycles; h < a.length; h += cycles) sumSq += a[h]! * a[h]!;
  if (!(fundamental > 1e-9 * Math.sqrt(total)) || fundamental === 0) return null;
  return Math.sqrt(sumSq) / fundamental;
}
