#include "noise/spectrum_evaluator.h"

#include <complex>

namespace hushgain {

Status SpectrumEvaluator::Create(const Netlist& netlist, double temperature_k,
                                 SpectrumEvaluator* evaluator) {
  Status s = MnaSystem::Build(netlist, &evaluator->system_);
  if (!s.ok) return s;
  evaluator->sources_ = CollectNoiseSources(netlist, temperature_k);
  evaluator->ports_.clear();
  for (const NoiseSource& source : evaluator->sources_)
    evaluator->ports_.push_back(evaluator->system_.Compile(source.excitation));
  evaluator->solver_ = std::make_unique<AdjointSolver>(evaluator->system_);
  return Status::Ok();
}

void SpectrumEvaluator::AddSources(const std::vector<NoiseSource>& sources) {
  for (const NoiseSource& source : sources) {
    sources_.push_back(source);
    ports_.push_back(system_.Compile(source.excitation));
  }
}

Status SpectrumEvaluator::Densities(double f_hz, double* psd) {
  Status s = solver_->SolveAt(f_hz);
  if (!s.ok) return s;
  for (std::size_t k = 0; k < sources_.size(); ++k)
    psd[k] = std::norm(solver_->Transfer(ports_[k])) * sources_[k].PsdAt(f_hz);
  return Status::Ok();
}

}  // namespace hushgain
