// SPDX-License-Identifier: MIT
// Running invariants: one-n steps, block jumps, and the derived table row.
#include "sqfc/track/tracker_state.hpp"

#include <string>

#include "sqfc/complex/face_counts.hpp"
#include "sqfc/core/error.hpp"

namespace sqfc::track {

void TrackerState::step(arith::FactorCode code) noexcept {
  ++n_;
  mu_n_ = arith::code_mu(code);
  mertens_ += mu_n_;
  liouville_ += arith::code_liouville(code);
  if (!arith::code_is_squarefree(code)) return;
  const int w = arith::code_omega(code);
  ++squarefree_;
  ++((n_ & 1) ? odd_ : even_)[w];
  topology::advance_interval_counts(interval_, n_, w, true);
}

void TrackerState::apply(const BlockSummary& s) {
  if (s.lo != n_ + 1)
    throw InvalidArgument("block summary starts at " + std::to_string(s.lo) + " but the state is at n = " +
                          std::to_string(n_));
  if (s.empty()) return;
  n_ = s.hi - 1;
  mertens_ += s.mertens;
  liouville_ += s.liouville;
  squarefree_ += s.squarefree();
  for (int w = 0; w < config::omega_slots; ++w) {
    odd_[w] += s.odd_squarefree[w];
    even_[w] += s.even_squarefree[w];
    // Odd squarefree m with omega w enter; m = k/2 with omega w leave when k = 2m is even
    // squarefree with omega w + 1 (identity 2, incremental form).
    interval_[w] += static_cast<SignedSum>(s.odd_squarefree[w]);
    if (w + 1 < config::omega_slots) interval_[w] -= static_cast<SignedSum>(s.even_squarefree[w + 1]);
  }
  mu_n_ = s.mu_last;
}

TableRow TrackerState::row() const noexcept {
  TableRow r;
  r.n = n_;
  r.mu = mu_n_;
  r.mertens = mertens_;
  r.euler = 1 - mertens_;
  r.squarefree = squarefree_;
  r.liouville = liouville_;
  Count positive_mu = 0;  // squarefree k in [2, n] with mu(k) = +1
  for (int w = 1; w < config::omega_slots; ++w) {
    const Count faces = odd_[w] + even_[w];
    r.faces[w - 1] = faces;
    r.div_edges += faces * complex::divisibility_edges_below(w);
    if (w % 2 == 0) positive_mu += faces;
  }
  r.fredholm = (positive_mu % 2 == 0) ? 1 : -1;
  for (int d = 0; d + 1 < config::omega_slots; ++d) r.betti[d] = topology::betti_from_interval_counts(interval_, d);
  return r;
}

}  // namespace sqfc::track
