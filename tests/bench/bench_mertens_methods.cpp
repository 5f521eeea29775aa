// SPDX-License-Identifier: MIT
// Plain benchmark program (no Google Benchmark): M(x) by the Deléglise–Rivat sweep
// (mertens_isolated, one thread) against the Helfgott–Thompson boxes
// (mertens_isolated_helfgott_thompson, one thread) at the same x, interleaved, in one run.
// It answers issue 3's question whether the x^(3/5) method wins below 10^20: medians, the
// ratio, the fitted growth exponents and the extrapolated ratio at 10^16..10^20, plus the work
// counts of the boxes. Both answers must agree with each other and, at powers of ten, with
// OEIS A084237; exit 1 otherwise.
//   bench_mertens_methods [--x 1e10,1e11,...] [--repeats R] [--out-dir DIR] [--smoke]
// Writes DIR/mertens_methods_<date>.csv (default data_out/bench), header as the other benchmarks.
#include <sys/utsname.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <sstream>
#include <string>
#include <thread>
#include <vector>

#include "sqfc/arith/isolated_values.hpp"
#include "sqfc/arith/mertens_helfgott_thompson.hpp"

#include "bench_support.hpp"

namespace {

using sqfc::bench::cpu_model;
using sqfc::bench::load_average;
using sqfc::bench::median;
using sqfc::bench::shell_line;
using sqfc::bench::utc_now;

using sqfc::Natural;
using sqfc::SignedSum;

// M(10^k), OEIS A084237 (from memory; the same values as tests/data/mertens_*powers_of_ten.csv).
const std::map<Natural, SignedSum> published = {
    {100'000'000ULL, 1928},           {1'000'000'000ULL, -222},          {10'000'000'000ULL, -33722},
    {100'000'000'000ULL, -87856},     {1'000'000'000'000ULL, 62366},     {10'000'000'000'000ULL, 599582},
    {100'000'000'000'000ULL, -875575}, {1'000'000'000'000'000ULL, -3216373}};

// Least-squares slope of log t against log x.
double fitted_exponent(const std::vector<double>& x, const std::vector<double>& t) {
  const auto n = static_cast<double>(x.size());
  double sx = 0, sy = 0, sxx = 0, sxy = 0;
  for (std::size_t i = 0; i < x.size(); ++i) {
    const double lx = std::log(x[i]), ly = std::log(t[i]);
    sx += lx;
    sy += ly;
    sxx += lx * lx;
    sxy += lx * ly;
  }
  return (n * sxy - sx * sy) / (n * sxx - sx * sx);
}

template <class F>
double seconds(F&& f) {
  const auto t0 = std::chrono::steady_clock::now();
  f();
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

struct Row {
  Natural x = 0;
  std::vector<double> dr, ht, boxes;
  SignedSum value = 0;
  sqfc::arith::HelfgottThompsonWork work, boxes_work;
};

// The boxes at work: from height 16 with the split x^(2/5), the tuning whose time grows like
// the method's x^(3/5) (the default leaves most pairs to the vector quotient sums below 10^15).
sqfc::arith::HelfgottThompsonOptions box_tuning(Natural x) {
  sqfc::arith::HelfgottThompsonOptions o;
  o.split = std::max<Natural>(sqfc::arith::default_helfgott_thompson_split(x), static_cast<Natural>(std::pow(static_cast<double>(x), 0.4)));
  o.min_box_height = 16;
  return o;
}

}  // namespace

int main(int argc, char** argv) {
  std::vector<Natural> xs{10'000'000'000ULL, 100'000'000'000ULL, 1'000'000'000'000ULL, 10'000'000'000'000ULL,
                          100'000'000'000'000ULL, 1'000'000'000'000'000ULL};
  unsigned repeats = 3;
  std::string out_dir = "data_out/bench";
  for (int i = 1; i < argc; ++i) {
    const std::string arg = argv[i];
    auto value = [&]() -> std::string {
      if (i + 1 >= argc) {
        std::cerr << "bench_mertens_methods: " << arg << " needs a value\n";
        std::exit(2);
      }
      return argv[++i];
    };
    if (arg == "--smoke") {
      xs = {100'000'000ULL, 1'000'000'000ULL};
      repeats = 1;
    } else if (arg == "--repeats") {
      repeats = static_cast<unsigned>(std::stoul(value()));
    } else if (arg == "--out-dir") {
      out_dir = value();
    } else if (arg == "--x") {
      xs.clear();
      std::stringstream list(value());
      for (std::string item; std::getline(list, item, ',');) xs.push_back(static_cast<Natural>(std::stod(item)));
    } else {
      std::cerr << "bench_mertens_methods: unknown option " << arg << "\n";
      return 2;
    }
  }
  if (xs.empty() || repeats == 0) {
    std::cerr << "bench_mertens_methods: nothing to run\n";
    return 2;
  }
  const std::string load_start = load_average();
  bool wrong = false;
  std::vector<Row> rows;
  for (const Natural x : xs) {
    Row row;
    row.x = x;
    for (unsigned r = 0; r < repeats; ++r) {
      SignedSum dr = 0, ht = 0, boxes = 0;
      row.dr.push_back(seconds([&] { dr = sqfc::arith::mertens_isolated(x); }));
      row.ht.push_back(seconds([&] { ht = sqfc::arith::mertens_isolated_helfgott_thompson(x, {}, &row.work); }));
      row.boxes.push_back(seconds([&] { boxes = sqfc::arith::mertens_isolated_helfgott_thompson(x, box_tuning(x), &row.boxes_work); }));
      if (dr != ht || dr != boxes) {
        std::cerr << "DISAGREE at x=" << x << ": Deleglise-Rivat " << dr << ", Helfgott-Thompson " << ht << ", with boxes "
                  << boxes << "\n";
        wrong = true;
      }
      const auto p = published.find(x);
      if (p != published.end() && p->second != dr) {
        std::cerr << "WRONG at x=" << x << ": " << dr << " against " << p->second << " (OEIS A084237)\n";
        wrong = true;
      }
      row.value = dr;
    }
    std::cout << "x=" << x << " M=" << row.value << " DR " << median(row.dr) << " s, HT " << median(row.ht) << " s, HT boxes "
              << median(row.boxes) << " s, ratios " << median(row.ht) / median(row.dr) << " and "
              << median(row.boxes) / median(row.dr) << std::endl;
    rows.push_back(row);
  }
  const std::string load_end = load_average();

  std::vector<double> lx, tdr, tht, tbox;
  for (const auto& r : rows) {
    lx.push_back(static_cast<double>(r.x));
    tdr.push_back(median(r.dr));
    tht.push_back(median(r.ht));
    tbox.push_back(median(r.boxes));
  }
  const bool fit = rows.size() >= 3;
  const double e_dr = fit ? fitted_exponent(lx, tdr) : NAN, e_ht = fit ? fitted_exponent(lx, tht) : NAN;
  const double e_box = fit ? fitted_exponent(lx, tbox) : NAN;
  // The ratio carried from the largest x measured along both fitted exponents (straight lines
  // in log-log; an extrapolation, not a measurement).
  auto ratio_at = [&](const std::vector<double>& t, double e, double target) {
    return t.back() / tdr.back() * std::pow(target / lx.back(), e - e_dr);
  };
  auto carried = [&](const std::vector<double>& t, double e) {
    std::ostringstream s;
    s << "1e16 " << ratio_at(t, e, 1e16) << ", 1e18 " << ratio_at(t, e, 1e18) << ", 1e20 " << ratio_at(t, e, 1e20);
    return s.str();
  };

  std::filesystem::create_directories(out_dir);
  const std::string csv = out_dir + "/mertens_methods_" + utc_now("%Y-%m-%dT%H%M%SZ") + ".csv";
  std::ofstream out(csv);
  const std::string commit = shell_line("git rev-parse HEAD 2>/dev/null");
  const bool dirty = !shell_line("git status --porcelain --untracked-files=no 2>/dev/null").empty();
  utsname host{};
  uname(&host);
  out << "# sqfc benchmark: M(x) by Deleglise-Rivat (mertens_isolated, 1 thread) against Helfgott-Thompson\n"
      << "#   (mertens_isolated_helfgott_thompson, 1 thread, default tuning), interleaved per repeat\n"
      << "# commit: " << (commit.empty() ? "unknown" : commit) << (dirty ? " (working tree has uncommitted changes)" : "")
      << "\n# compiler: g++ " << __VERSION__ << "\n# cpu: " << cpu_model() << ", " << std::thread::hardware_concurrency()
      << " cores available\n# date: " << utc_now("%Y-%m-%dT%H:%M:%SZ") << "\n# host: " << host.sysname << " "
      << host.release << " " << host.machine << "\n# repeats: " << repeats << " (median)\n"
      << "# load average (1/5/15 min): start " << load_start << ", end " << load_end << "\n"
      << "# references: M(10^k) OEIS A084237; both methods must agree at every x\n";
  out << "# boxes: split max(default, x^(2/5)), boxes from height 16\n";
  if (fit)
    out << "# fitted exponents: Deleglise-Rivat " << e_dr << ", Helfgott-Thompson " << e_ht << ", with boxes " << e_box
        << "\n# ratio to Deleglise-Rivat carried along the fits: default " << carried(tht, e_ht) << "; with boxes "
        << carried(tbox, e_box) << "\n";
  out << "x,mertens,method,median_s,ratio_to_dr,split,sieve_limit,boxes,box_pairs,box_columns,"
         "box_table_entries,corrections,long_classes,direct_pairs,lookups\n";
  for (const auto& r : rows) {
    out << r.x << "," << r.value << ",deleglise_rivat," << median(r.dr) << ",1,,,,,,,,,,\n";
    for (int k = 0; k < 2; ++k) {
      const auto& w = k == 0 ? r.work : r.boxes_work;
      const double t = median(k == 0 ? r.ht : r.boxes);
      out << r.x << "," << r.value << "," << (k == 0 ? "helfgott_thompson" : "helfgott_thompson_boxes") << "," << t << ","
          << t / median(r.dr) << "," << w.split << "," << w.sieve_limit << "," << w.boxes << "," << w.box_pairs << ","
          << w.box_columns << "," << w.box_table_entries << "," << w.corrections << "," << w.long_classes << ","
          << w.direct_pairs << "," << w.lookups << "\n";
    }
  }
  out.close();
  std::cout << "bench_mertens_methods (" << cpu_model() << ", load " << load_start << " -> " << load_end << ")\n";
  if (fit)
    std::cout << "fitted exponents: Deleglise-Rivat " << e_dr << ", Helfgott-Thompson " << e_ht << ", with boxes " << e_box
              << "\nratio to Deleglise-Rivat carried along the fits: default " << carried(tht, e_ht) << "; with boxes "
              << carried(tbox, e_box) << "\n";
  std::cout << "csv: " << csv << "\n" << (wrong ? "answers: FAIL\n" : "answers: pass\n");
  return wrong ? 1 : 0;
}
