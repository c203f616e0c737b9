#include "montecarlo/random_stream.h"

#include <cmath>

namespace hushgain {
namespace {

std::uint64_t RotateLeft(std::uint64_t x, int k) {
  return (x << k) | (x >> (64 - k));
}

}  // namespace

std::uint64_t SplitMix64(std::uint64_t* state) {
  std::uint64_t z = (*state += 0x9E3779B97F4A7C15ull);
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
  return z ^ (z >> 31);
}

RandomStream::RandomStream(std::uint64_t seed, std::uint64_t index) {
  std::uint64_t mix = seed;
  std::uint64_t state = SplitMix64(&mix) ^ index;
  for (std::uint64_t& word : s_) word = SplitMix64(&state);
}

std::uint64_t RandomStream::Next() {
  const std::uint64_t result = RotateLeft(s_[1] * 5, 7) * 9;
  const std::uint64_t t = s_[1] << 17;
  s_[2] ^= s_[0];
  s_[3] ^= s_[1];
  s_[1] ^= s_[2];
  s_[0] ^= s_[3];
  s_[2] ^= t;
  s_[3] = RotateLeft(s_[3], 45);
  return result;
}

double RandomStream::Uniform01() {
  return static_cast<double>(Next() >> 11) * 0x1.0p-53;
}

double RandomStream::UniformSymmetric(double half_width) {
  return half_width * (2.0 * Uniform01() - 1.0);
}

double RandomStream::Gaussian(double sigma) {
  if (has_spare_) {
    has_spare_ = false;
    return sigma * spare_;
  }
  double u, v, s;
  do {
    u = 2.0 * Uniform01() - 1.0;
    v = 2.0 * Uniform01() - 1.0;
    s = u * u + v * v;
  } while (s >= 1.0 || s == 0.0);
  const double factor = std::sqrt(-2.0 * std::log(s) / s);
  spare_ = v * factor;
  has_spare_ = true;
  return sigma * u * factor;
}

}  // namespace hushgain
