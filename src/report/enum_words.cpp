#include "report/enum_words.h"

namespace hushgain {

const char* NoiseKindWord(NoiseKind kind) {
  switch (kind) {
    case NoiseKind::kThermal:
      return "thermal";
    case NoiseKind::kShot:
      return "shot";
    case NoiseKind::kOpAmpVoltage:
      return "voltage_noise";
    case NoiseKind::kOpAmpCurrent:
      return "current_noise";
    case NoiseKind::kExcess:
      return "excess";
    case NoiseKind::kSupply:
      return "supply";
  }
  return "?";
}

std::string NoiseKindLabel(NoiseKind kind) {
  switch (kind) {
    case NoiseKind::kOpAmpVoltage:
      return "op-amp e_n";
    case NoiseKind::kOpAmpCurrent:
      return "op-amp i_n";
    case NoiseKind::kExcess:
      return "excess 1/f";
    case NoiseKind::kSupply:
      return "bias supply";
    default:
      return NoiseKindWord(kind);
  }
}

const char* TiaLimitWord(TiaLimit limit) {
  switch (limit) {
    case TiaLimit::kBandwidth:
      return "bandwidth";
    case TiaLimit::kHeadroom:
      return "headroom";
  }
  return "?";
}

const char* TeeRankingWord(TeeRanking ranking) {
  switch (ranking) {
    case TeeRanking::kNoise:
      return "noise";
    case TeeRanking::kOffset:
      return "offset";
    case TeeRanking::kWeighted:
      return "weighted";
  }
  return "?";
}

}  // namespace hushgain
