// "Did you mean": Levenshtein distance (V. I. Levenshtein, "Binary codes
// capable of correcting deletions, insertions and reversals", 1966; the
// textbook examples below are the usual ones, from memory).
#include "io/suggest.h"

#include <doctest/doctest.h>

namespace hushgain {
namespace {

TEST_CASE("edit distance counts insertions deletions and substitutions") {
  CHECK(EditDistance("kitten", "sitting") == 3);
  CHECK(EditDistance("flaw", "lawn") == 2);
  CHECK(EditDistance("", "abc") == 3);
  CHECK(EditDistance("abc", "abc") == 0);
}

TEST_CASE("a close candidate is suggested and a far one is not") {
  CHECK(DidYouMean("resistr", {"resistor", "capacitor"}) ==
        " (did you mean \"resistor\"?)");
  CHECK(DidYouMean("zzzzzzzz", {"resistor", "capacitor"}).empty());
  CHECK(DidYouMean("x", {}).empty());
}

TEST_CASE("the closest of several candidates wins") {
  CHECK(DidYouMean("noize", {"offset", "noise", "weighted"}) ==
        " (did you mean \"noise\"?)");
}

}  // namespace
}  // namespace hushgain
