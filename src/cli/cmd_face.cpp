// SPDX-License-Identifier: MIT
// `sqfc face`: parse K (any size) and --n, describe K with the library, print text or JSON.
#include "cmd_face.hpp"

#include <CLI/CLI.hpp>
#include <iostream>
#include <sstream>

#include "sqfc/arith/big_factor.hpp"
#include "sqfc/complex/face.hpp"
#include "sqfc/complex/face_neighbourhood.hpp"
#include "sqfc/core/error.hpp"
#include "sqfc/core/number_parse.hpp"
#include "sqfc/io/json.hpp"

namespace sqfc::cli {
namespace {

// What --n adds: whether K lies in K_N, and when it does its neighbourhood counts.
struct InComplex {
  Natural n = 0;
  Count faces = 0;                              // faces of K_N
  std::optional<complex::FaceNeighbourhood> counts;  // set when K is a face of K_N
  std::string reason;                           // why not, when counts is empty
};

InComplex locate(const complex::FaceDescription& face, Natural n) {
  InComplex r;
  r.n = n;
  const complex::SquarefreeCounter counter(n);
  r.faces = counter.squarefree_count(n) - 1;
  if (face.kind == complex::FaceKind::empty) {
    r.reason = "the empty face is not a face of K_N";
  } else if (face.kind == complex::FaceKind::not_a_face) {
    r.reason = "K is not squarefree";
  } else if (arith::compare_decimal(face.value, std::to_string(n)) > 0) {
    r.reason = "K > N";
  } else {
    r.counts = complex::face_neighbourhood(counter, parse_natural(face.value, "K"), n);
  }
  return r;
}

std::string set_text(const std::vector<std::string>& primes) {
  std::string s = "{";
  for (std::size_t i = 0; i < primes.size(); ++i) s += (i ? ", " : "") + primes[i];
  return s + "}";
}

std::string factorisation_text(const complex::FaceDescription& face) {
  if (face.factorisation.empty()) return "1 (no prime factors)";
  std::string s;
  for (std::size_t i = 0; i < face.factorisation.size(); ++i) {
    const auto& f = face.factorisation[i];
    s += (i ? " * " : "") + f.prime + (f.exponent > 1 ? "^" + std::to_string(f.exponent) : "");
  }
  return s;
}

void write_text(std::ostream& out, const complex::FaceDescription& face, const std::optional<InComplex>& in) {
  out << "K: " << face.value << '\n';
  out << "factorisation: " << factorisation_text(face) << '\n';
  out << "squarefree: ";
  if (face.squarefree) {
    out << "yes\n";
  } else {
    for (const auto& f : face.factorisation)
      if (f.exponent > 1) {
        out << "no (" << f.prime << "^2 divides K)\n";
        break;
      }
  }
  out << "mu: " << face.mu << "\nomega: " << face.omega << "\nOmega: " << face.big_omega << '\n';
  switch (face.kind) {
    case complex::FaceKind::empty:
      out << "face: the empty face {}, dimension -1 (a face of no K_n: their faces start at 2)\n";
      break;
    case complex::FaceKind::not_a_face:
      out << "face: none (K is not squarefree, so it is no face of any K_n)\n";
      break;
    case complex::FaceKind::face: {
      out << "face: " << set_text(face.primes) << ", dimension " << face.dimension
          << (face.dimension == 0 ? " (a vertex)" : "") << '\n';
      out << "boundary: " << face.boundary.size() << (face.boundary.size() == 1 ? " face" : " faces")
          << " of dimension " << face.dimension - 1 << '\n';
      for (const auto& b : face.boundary)
        out << "  " << b.value << " = " << set_text(b.primes) << " (without " << b.removed_prime << ")"
            << (b.primes.empty() ? ", the empty face" : "") << '\n';
      break;
    }
  }
  if (!in) return;
  out << "N: " << in->n << "\nfaces of K_N: " << in->faces << '\n';
  if (!in->counts) {
    out << "in K_N: no (" << in->reason << ")\n";
    return;
  }
  out << "in K_N: yes\ncofaces in K_N: " << in->counts->cofaces << "\ndegree in G_N: " << in->counts->divisibility_degree
      << "\ndegree in H_N: " << in->counts->shared_factor_degree << '\n';
}

io::Json strings(const std::vector<std::string>& items) {
  io::Json a = io::Json::Array{};
  for (const auto& s : items) a.push(s);
  return a;
}

void write_json(std::ostream& out, const complex::FaceDescription& face, const std::optional<InComplex>& in) {
  io::Json j;
  j.set("k", face.value);
  io::Json factors = io::Json::Array{};
  for (const auto& f : face.factorisation) {
    io::Json p;
    p.set("prime", f.prime);
    p.set("exponent", f.exponent);
    factors.push(std::move(p));
  }
  j.set("factorisation", std::move(factors));
  j.set("squarefree", face.squarefree);
  j.set("mu", face.mu);
  j.set("omega", face.omega);
  j.set("big_omega", face.big_omega);
  j.set("face", face.kind == complex::FaceKind::face ? "face" : face.kind == complex::FaceKind::empty ? "empty" : "none");
  j.set("dimension", face.dimension);
  j.set("primes", strings(face.primes));
  io::Json boundary = io::Json::Array{};
  for (const auto& b : face.boundary) {
    io::Json f;
    f.set("face", b.value);
    f.set("primes", strings(b.primes));
    f.set("dimension", b.dimension);
    f.set("removed_prime", b.removed_prime);
    boundary.push(std::move(f));
  }
  j.set("boundary", std::move(boundary));
  if (in) {
    io::Json c;
    c.set("n", in->n);
    c.set("faces", in->faces);
    c.set("in_complex", in->counts.has_value());
    if (in->counts) {
      c.set("cofaces", in->counts->cofaces);
      c.set("divisibility_degree", in->counts->divisibility_degree);
      c.set("shared_factor_degree", in->counts->shared_factor_degree);
    } else {
      c.set("reason", in->reason);
    }
    j.set("complex", std::move(c));
  }
  out << j.dump(2) << '\n';
}

}  // namespace

void add_face_command(CLI::App& app, FaceArguments& a) {
  auto* cmd = app.add_subcommand("face", "One integer K of any size as a face: factorisation, mu, dimension, boundary");
  cmd->add_option("K", a.k, "the integer: digits, 1e30, 10^30 or 2^200")->required();
  cmd->add_option_function<std::string>(
      "--n", [&a](const std::string& v) { a.n = v; }, "also place K in K_N: cofaces, degrees in G_N and H_N (N <= 10^10)");
  cmd->add_option("--format", a.format, "text (default) or json");
}

int run_face_command(const FaceArguments& a, const Invocation& /*invocation*/) {
  // Validate every argument before factoring, which may take long for hard inputs.
  if (a.format != "text" && a.format != "json")
    throw InvalidArgument("--format: '" + a.format + "' is not one of text, json");
  const std::string k = arith::parse_big_natural(a.k, "K");
  if (k == "0") throw InvalidArgument("K: '" + a.k + "' is 0; K must be a positive integer");
  std::optional<Natural> n;
  if (a.n) n = parse_number_option(*a.n, "--n", 1, complex::max_neighbourhood_n);
  const complex::FaceDescription face = complex::describe_face(k);
  std::optional<InComplex> in;
  if (n) in = locate(face, *n);
  std::ostringstream text;
  if (a.format == "json")
    write_json(text, face, in);
  else
    write_text(text, face, in);
  std::cout << text.str();
  return exit_code::ok;
}

}  // namespace sqfc::cli
