/**
 * A small seeded random source, so the demo worklist is the same on every machine:
 * mulberry32 (a 32-bit generator in the public domain, T. Ettinger 2017; common practice, no
 * published paper) for uniforms and the Box–Muller transform (Box & Muller 1958, Ann. Math.
 * Stat. 29, 610) for standard normals.
 */
export interface Random {
  /** Uniform in [0, 1). */
  uniform(): number;
  /** Standard normal (mean 0, σ 1). */
  normal(): number;
}

export function seededRandom(seed: number): Random {
  let state = seed >>> 0;
  const uniform = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    const radius = Math.sqrt(-2 * Math.log(1 - uniform()));
    const angle = 2 * Math.PI * uniform();
    spare = radius * Math.sin(angle);
    return radius * Math.cos(angle);
  };
  return { uniform, normal };
}
