// The words the reports print for the core's enums. Results carry enums;
// every report (text, Markdown, CSV, JSON, plots) names them through these
// functions and nowhere else, so a name changes in one place.
#ifndef HUSHGAIN_REPORT_ENUM_WORDS_H_
#define HUSHGAIN_REPORT_ENUM_WORDS_H_

#include <cstdint>
#include <string>
#include <vector>

#include "budget/stage_problem.h"
#include "circuit/signal_chain.h"
#include "design/opamp_comparison.h"
#include "design/tee_search.h"
#include "design/tia_suggest.h"
#include "noise/noise_source.h"

namespace hushgain {

// The JSON and CSV names: "thermal", "shot", "voltage_noise",
// "current_noise", "excess", "supply".
const char* NoiseKindWord(NoiseKind kind);

// The label of the budget table's kind column: "thermal", "shot",
// "op-amp e_n", "op-amp i_n", "excess 1/f".
std::string NoiseKindLabel(NoiseKind kind);

// The stage file's words, also in JSON: "butterworth", "bessel",
// "single_pole", "none".
const char* FilterKindWord(ChainFilter::Kind kind);

// "noise", "offset" or "weighted" (also the values of `tee search --rank`).
const char* TeeRankingWord(TeeRanking ranking);

// "input-noise" or "offset" (also the values of `compare --rank`).
const char* OpAmpRankingWord(OpAmpRanking ranking);

// The verdict of a compare row: "fits", "refused", or the checks that
// fail, joined with spaces: the StageProblemWord()s, then "phase-margin",
// "bandwidth" and "low-corner".
std::vector<std::string> OpAmpVerdictWords(const OpAmpComparisonRow& row);
std::string OpAmpVerdict(const OpAmpComparisonRow& row);

// "bandwidth" or "headroom": which limit sets tia suggest's largest R_f.
const char* TiaLimitWord(TiaLimit limit);

// A row's flag for a stage that cannot work: "offset>FS",
// "offset>supply", "dc>FS", "dc>supply", "clips", "FS>supply",
// "gain-collapsed", "current>limit".
const char* StageProblemWord(StageProblem problem);

// The flags of a row, joined with spaces; "-" for none.
std::string StageProblemFlags(const std::vector<StageProblem>& problems);
// The same from StageProblemBit()s (a spread sample's).
std::string StageProblemFlags(std::uint32_t bits);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_ENUM_WORDS_H_
