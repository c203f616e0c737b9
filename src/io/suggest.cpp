#include "io/suggest.h"

#include <algorithm>
#include <vector>

namespace hushgain {

int EditDistance(std::string_view a, std::string_view b) {
  std::vector<int> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = static_cast<int>(j);
  for (std::size_t i = 1; i <= a.size(); ++i) {
    int diagonal = row[0];
    row[0] = static_cast<int>(i);
    for (std::size_t j = 1; j <= b.size(); ++j) {
      int above = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1,
                         diagonal + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diagonal = above;
    }
  }
  return row[b.size()];
}

std::string DidYouMean(std::string_view name,
                       const std::vector<std::string>& candidates) {
  const int limit = std::max<int>(2, static_cast<int>(name.size()) / 3 + 1);
  const std::string* best = nullptr;
  int best_distance = limit + 1;
  for (const std::string& c : candidates) {
    int d = EditDistance(name, c);
    if (d < best_distance) {
      best_distance = d;
      best = &c;
    }
  }
  if (!best) return "";
  return " (did you mean \"" + *best + "\"?)";
}

}  // namespace hushgain
