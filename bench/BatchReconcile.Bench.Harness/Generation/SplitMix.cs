namespace BatchReconcile.Bench.Harness.Generation;

/// <summary>
/// SplitMix64 (Steele, Lea and Flood, OOPSLA 2014): a tiny generator whose streams for neighbouring
/// (seed, index) pairs are unrelated, unlike System.Random seeded with consecutive numbers, and whose
/// output is fixed by the algorithm, not by the runtime version.
/// </summary>
internal struct SplitMix(int seed, int index)
{
    private ulong _state = unchecked(((ulong)(uint)seed << 32) ^ (uint)index);

    public double NextDouble() => (Next() >> 11) * (1.0 / (1UL << 53));

    private ulong Next()
    {
        unchecked
        {
            var z = _state += 0x9E3779B97F4A7C15UL;
            z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
            z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
            return z ^ (z >> 31);
        }
    }
}
