// "did you mean ..." for unknown names: the closest candidate by edit
// distance (Levenshtein), when it is close enough to be a likely typo.
#ifndef HUSHGAIN_IO_SUGGEST_H_
#define HUSHGAIN_IO_SUGGEST_H_

#include <string>
#include <string_view>
#include <vector>

namespace hushgain {

int EditDistance(std::string_view a, std::string_view b);

// Returns " (did you mean \"x\"?)" or "" when no candidate is within
// max(2, |name| / 3 + 1) edits.
std::string DidYouMean(std::string_view name,
                       const std::vector<std::string>& candidates);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_SUGGEST_H_
