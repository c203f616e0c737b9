// The budget's JSON keys on real parts: "temperature", "compensation" and
// "resistors" (README, "JSON keys").
#ifndef HUSHGAIN_REPORT_REAL_PARTS_JSON_H_
#define HUSHGAIN_REPORT_REAL_PARTS_JSON_H_

#include <nlohmann/json_fwd.hpp>

#include "budget/budget.h"

namespace hushgain {

// Adds the keys of the blocks the budget has to `out` (an object).
void AddRealPartsJson(const Budget& b, nlohmann::json& out);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_REAL_PARTS_JSON_H_
