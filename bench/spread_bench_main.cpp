// hushgain_spread_bench: runs the spread benchmark alone.
namespace hushgain {
void RunSpreadBenchmarks();
}

int main() {
  hushgain::RunSpreadBenchmarks();
  return 0;
}
