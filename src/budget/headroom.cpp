#include "budget/headroom.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "base/printf.h"

namespace hushgain {
namespace {

// The checks of the header, once: `found(problem, text)` is called for each
// failed one, `text` building the warning only when asked.
template <typename Found>
void Visit(const HeadroomInputs& in, Found found) {
  const double half_supply = 0.5 * in.supply_span_v;
  const auto supply = [&] {
    return Printf("half the %.4g V supply span (%.4g V)", in.supply_span_v,
                  half_supply);
  };
  const auto fs = [&] {
    return Printf("the full-scale swing (\xC2\xB1%.4g V)", *in.full_scale_v);
  };
  const auto offset = [&] {
    return Printf("the worst-case output offset (%.4g V) exceeds ",
                  in.offset_v);
  };
  if (in.full_scale_v && in.offset_v > *in.full_scale_v)
    found(StageProblem::kOffsetBeyondFullScale,
          [&] { return offset() + fs(); });
  if (in.offset_v > half_supply)
    found(StageProblem::kOffsetBeyondSupply,
          [&] { return offset() + supply() + ": the output sits at a rail"; });
  for (const DcOutputTerm& t : in.dc_outputs) {
    const double v = std::fabs(t.volts);
    const auto term = [&] {
      return "the DC output from " + t.name + Printf(" (%.4g V) exceeds ", v);
    };
    if (in.full_scale_v && v > *in.full_scale_v)
      found(StageProblem::kDcBeyondFullScale, [&] { return term() + fs(); });
    if (v > half_supply)
      found(StageProblem::kDcBeyondSupply, [&] { return term() + supply(); });
  }
  if (!in.full_scale_v) return;
  if (*in.full_scale_v > half_supply)
    found(StageProblem::kFullScaleBeyondSupply, [&] {
      return Printf(
          "the full-scale swing of \xC2\xB1%.4g V exceeds half the %.4g V "
          "supply span",
          *in.full_scale_v, in.supply_span_v);
    });
  else if (in.dc_total_v + *in.full_scale_v > half_supply)
    found(StageProblem::kSwingBeyondSupply, [&] {
      return Printf(
                 "the worst-case DC output (%.4g V) plus the full-scale "
                 "swing (%.4g V) exceeds ",
                 in.dc_total_v, *in.full_scale_v) +
             supply() + ": the signal clips";
    });
}

}  // namespace

HeadroomCheck CheckHeadroom(const HeadroomInputs& in) {
  HeadroomCheck out;
  Visit(in, [&](StageProblem problem, const auto& text) {
    out.warnings.push_back(text());
    if (std::find(out.problems.begin(), out.problems.end(), problem) ==
        out.problems.end())
      out.problems.push_back(problem);
  });
  return out;
}

std::uint32_t HeadroomProblemBits(const HeadroomInputs& in) {
  std::uint32_t bits = 0;
  Visit(in, [&](StageProblem problem, const auto&) {
    bits |= StageProblemBit(problem);
  });
  return bits;
}

}  // namespace hushgain
