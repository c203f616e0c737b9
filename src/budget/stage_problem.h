// Why a stage cannot work as asked, as data: every warning of this kind
// also records its problem, so a table of many budgets (tee sweep, tee
// search, spread) can flag each row; report/enum_words.h names them.
#ifndef HUSHGAIN_BUDGET_STAGE_PROBLEM_H_
#define HUSHGAIN_BUDGET_STAGE_PROBLEM_H_

#include <cstdint>

namespace hushgain {

enum class StageProblem {
  kOffsetBeyondFullScale,  // worst-case offset > full-scale swing
  kOffsetBeyondSupply,     // worst-case offset > half the supply span
  kDcBeyondFullScale,      // a DC output term > full-scale swing
  kDcBeyondSupply,         // a DC output term > half the supply span
  kSwingBeyondSupply,      // DC output + full scale > half the supply span
  kFullScaleBeyondSupply,  // full scale alone > half the supply span
  kGainCollapsed,          // in-band gain > 3 dB below the ideal network's
  kOutputCurrent,          // output current at full scale > the limit
};

// One bit per problem, for compact per-sample flags.
inline constexpr std::uint32_t StageProblemBit(StageProblem problem) {
  return 1u << static_cast<int>(problem);
}
inline constexpr int kStageProblemCount = 8;

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_STAGE_PROBLEM_H_
