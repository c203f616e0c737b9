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
    case NoiseKind::kSensorVoltage:
    case NoiseKind::kSensorCurrent:
      return "sensor";
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
    case TeeRanking::kInputNoise:
      return "input-noise";
    case TeeRanking::kNoise:
      return "noise";
    case TeeRanking::kOffset:
      return "offset";
    case TeeRanking::kWeighted:
      return "weighted";
  }
  return "?";
}

const char* OpAmpRankingWord(OpAmpRanking ranking) {
  switch (ranking) {
    case OpAmpRanking::kInputNoise:
      return "input-noise";
    case OpAmpRanking::kOffset:
      return "offset";
  }
  return "?";
}

std::vector<std::string> OpAmpVerdictWords(const OpAmpComparisonRow& row) {
  if (!row.status.ok) return {"refused"};
  std::vector<std::string> words;
  for (StageProblem p : row.budget.problems)
    words.push_back(StageProblemWord(p));
  if (row.low_phase_margin) words.push_back("phase-margin");
  if (row.narrow_bandwidth) words.push_back("bandwidth");
  if (row.high_low_corner) words.push_back("low-corner");
  return words;
}

std::string OpAmpVerdict(const OpAmpComparisonRow& row) {
  std::string out;
  for (const std::string& w : OpAmpVerdictWords(row))
    out += (out.empty() ? "" : " ") + w;
  return out.empty() ? "fits" : out;
}

const char* StageProblemWord(StageProblem problem) {
  switch (problem) {
    case StageProblem::kOffsetBeyondFullScale:
      return "offset>FS";
    case StageProblem::kOffsetBeyondSupply:
      return "offset>supply";
    case StageProblem::kDcBeyondFullScale:
      return "dc>FS";
    case StageProblem::kDcBeyondSupply:
      return "dc>supply";
    case StageProblem::kSwingBeyondSupply:
      return "clips";
    case StageProblem::kFullScaleBeyondSupply:
      return "FS>supply";
    case StageProblem::kGainCollapsed:
      return "gain-collapsed";
    case StageProblem::kOutputCurrent:
      return "current>limit";
  }
  return "?";
}

std::string StageProblemFlags(const std::vector<StageProblem>& problems) {
  std::string out;
  for (StageProblem p : problems)
    out += (out.empty() ? "" : " ") + std::string(StageProblemWord(p));
  return out.empty() ? "-" : out;
}

std::string StageProblemFlags(std::uint32_t bits) {
  std::vector<StageProblem> problems;
  for (int i = 0; i < kStageProblemCount; ++i)
    if (bits & StageProblemBit(static_cast<StageProblem>(i)))
      problems.push_back(static_cast<StageProblem>(i));
  return StageProblemFlags(problems);
}

const char* FilterKindWord(ChainFilter::Kind kind) {
  switch (kind) {
    case ChainFilter::Kind::kButterworth:
      return "butterworth";
    case ChainFilter::Kind::kBessel:
      return "bessel";
    case ChainFilter::Kind::kSinglePole:
      return "single_pole";
    case ChainFilter::Kind::kNone:
      return "none";
  }
  return "none";
}

}  // namespace hushgain
