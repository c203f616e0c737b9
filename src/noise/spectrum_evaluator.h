// Per-contributor output noise densities of a netlist at any frequency:
//   S_out,k(f) = |H_k(j 2 pi f)|^2 S_k(f)
// where H_k is the transfer from noise source k to the output. One adjoint
// solve per frequency gives every H_k (see analysis/mna_system.h), so the
// cost of a frequency point does not grow with the number of contributors.
#ifndef HUSHGAIN_NOISE_SPECTRUM_EVALUATOR_H_
#define HUSHGAIN_NOISE_SPECTRUM_EVALUATOR_H_

#include <memory>
#include <vector>

#include "analysis/mna_system.h"
#include "circuit/netlist.h"
#include "noise/noise_source.h"

namespace hushgain {

class SpectrumEvaluator {
 public:
  // Builds the MNA system of `netlist`; fails as MnaSystem::Build fails.
  // `evaluator` must not move after it is built (the solver refers to the
  // system it holds), hence the unique construction through Create.
  static Status Create(const Netlist& netlist, double temperature_k,
                       SpectrumEvaluator* evaluator);

  SpectrumEvaluator() = default;
  SpectrumEvaluator(const SpectrumEvaluator&) = delete;
  SpectrumEvaluator& operator=(const SpectrumEvaluator&) = delete;

  // Appends sources (e.g. excess noise, which needs the DC solution of the
  // built system) and compiles their excitations.
  void AddSources(const std::vector<NoiseSource>& sources);

  const std::vector<NoiseSource>& sources() const { return sources_; }
  int source_count() const { return static_cast<int>(sources_.size()); }
  const MnaSystem& system() const { return system_; }

  // Solves at f_hz; afterwards Transfer() and the density values refer to f.
  Status SolveAt(double f_hz) { return solver_->SolveAt(f_hz); }
  Complex Transfer(Port port) const { return solver_->Transfer(port); }
  Complex SourceTransfer(int k) const { return solver_->Transfer(ports_[k]); }
  Port Compile(const Excitation& e) const { return system_.Compile(e); }

  // Solves at f_hz and writes S_out,k(f) for every source into `psd` (V^2/Hz).
  Status Densities(double f_hz, double* psd);

 private:
  MnaSystem system_;
  std::vector<NoiseSource> sources_;
  std::vector<Port> ports_;
  std::unique_ptr<AdjointSolver> solver_;
};

}  // namespace hushgain

#endif  // HUSHGAIN_NOISE_SPECTRUM_EVALUATOR_H_
