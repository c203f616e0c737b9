#define DOCTEST_CONFIG_IMPLEMENT
#include <doctest/doctest.h>
#include <stdlib.h>

int main(int argc, char** argv) {
  // The built binary spells its text in ASCII under a non-UTF-8 locale
  // (cli/text_output.h); the tests expect UTF-8 whatever the machine's
  // locale, and set another one only where they test that choice.
  ::setenv("LC_ALL", "C.UTF-8", 1);
  return doctest::Context(argc, argv).run();
}
