namespace hushgain {
void RunTeeSearchBenchmarks() {}
}  // namespace hushgain
