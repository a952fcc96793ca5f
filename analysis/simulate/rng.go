package simulate

import "math/rand/v2"

// splitmix64 is the finaliser of Steele, Lea and Flood's SplitMix64
// generator (2014), a bijection of uint64 that scatters nearby inputs.
func splitmix64(x uint64) uint64 {
	x += 0x9e3779b97f4a7c15
	x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9
	x = (x ^ (x >> 27)) * 0x94d049bb133111eb
	return x ^ (x >> 31)
}

// streamSeed returns the two 64-bit words of the PCG state of block b
// under seed: (splitmix64(seed), splitmix64(splitmix64(seed) ⊕
// splitmix64(b+1))). Distinct blocks get unrelated starting points of the
// 2¹²⁸-period PCG sequence; their overlap within a block's few hundred
// thousand draws has negligible probability.
func streamSeed(seed uint64, b int) (uint64, uint64) {
	s1 := splitmix64(seed)
	return s1, splitmix64(s1 ^ splitmix64(uint64(b)+1))
}

// blockRand reseeds pcg for block b and returns r (which wraps pcg).
func blockRand(pcg *rand.PCG, r *rand.Rand, seed uint64, b int) *rand.Rand {
	pcg.Seed(streamSeed(seed, b))
	return r
}
