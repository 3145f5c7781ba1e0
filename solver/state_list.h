/// \file state_list.h
/// \brief Simulation::visit_state: every piece of state a resumed run needs, one call per
/// array, f(name, data, count) (simulation.h). Saving and loading (io/run/checkpoint) and the
/// ranks' ownership of the parts (solver/parallel/state_owners.cpp) all go through this one
/// list, so their order cannot drift apart. Included at the end of simulation.h.
#pragma once

namespace ty {

template <class R>
template <class F>
void Simulation<R>::visit_state(F&& f) {
  static const char* names[6] = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};
  for (int c = 0; c < 6; ++c) f(std::string("fields/") + names[c], f_[c].data(), f_[c].size());
  AlignedArray<R>* psi[8] = {&psi_hyx_, &psi_hzx_, &psi_eyx_, &psi_ezx_, &psi_hxy_, &psi_hzy_, &psi_exy_, &psi_ezy_};
  static const char* pn[8] = {"hyx", "hzx", "eyx", "ezx", "hxy", "hzy", "exy", "ezy"};
  for (int k = 0; k < 8; ++k) f(std::string("absorber/psi-") + pn[k], psi[k]->data(), psi[k]->size());
  for (int p = 0; p < 2; ++p) {
    const std::string q = std::to_string(p);
    for (int c = 0; c < 6; ++c) f("magnets/m" + q + std::to_string(c), mag_.m[p][c].data(), mag_.m[p][c].size());
    f("magnets/dM" + q + "1", mag_.dMy[p].data(), mag_.dMy[p].size());  // y: the name older checkpoints gave it
  }
  f("media/polarization", disp_.p.data(), disp_.p.size());
  f("media/polarization-rate", disp_.j.data(), disp_.j.size());
  f("media/tensor-e", tensor_.e_node.data(), tensor_.e_node.size());
  f("media/tensor-e-axes", tensor_.e_axis.data(), tensor_.e_axis.size());
  f("media/tensor-polarization", tensor_.p.data(), tensor_.p.size());
  f("media/tensor-polarization-rate", tensor_.j.data(), tensor_.j.size());
  for (auto& p : probes_) p.visit_state(f);
  for (auto& fl : power_spectra_) fl.visit_state(f);
  for (auto& m : maps_) m.visit_state(f);
  snaps_.visit_state(f);
  stop_.visit_state(f);
  f("guard/injected-work", injected_.data(), injected_.size());
  if (twin_) {  // the sine copy's, under sine/ (one visitor type, so the template stops here)
    StateVisitor sine{[&f](const std::string& n, R* p, std::size_t k) { f("sine/" + n, p, k); },
                      [&f](const std::string& n, double* p, std::size_t k) { f("sine/" + n, p, k); },
                      [&f](const std::string& n, long* p, std::size_t k) { f("sine/" + n, p, k); }};
    twin_->visit_state(sine);
  }
  f("clock/steps", &n_, 1);
  for (auto& p : probes_) p.count = n_;
  for (auto& fl : power_spectra_) fl.steps = n_;
  for (auto& m : maps_) m.steps = n_;
  mag_.latest = MagneticCells::newest(n_);
}

}  // namespace ty
