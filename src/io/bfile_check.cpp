// SPDX-License-Identifier: MIT
// Term-by-term comparison of a b-file with computed values, and the text report.
#include "sqfc/io/bfile_check.hpp"

#include "sqfc/core/error.hpp"

namespace sqfc::io {
namespace {

// Prints the first `max_listed` items of a finding list, then how many were left out.
template <class Item, class Print>
void list_items(std::ostream& out, const std::vector<Item>& items, std::size_t max_listed, Print&& print) {
  for (std::size_t i = 0; i < items.size() && i < max_listed; ++i) {
    out << "  ";
    print(items[i]);
    out << '\n';
  }
  if (items.size() > max_listed) out << "  (" << items.size() - max_listed << " more not listed)\n";
}

}  // namespace

std::vector<std::int64_t> bfile_indices(const BfileContents& contents) {
  std::vector<std::int64_t> indices;
  indices.reserve(contents.terms.size());
  for (const auto& t : contents.terms) indices.push_back(t.n);
  return indices;
}

BfileComparison compare_bfile_terms(const BfileContents& contents, const std::vector<track::TermValue>& values) {
  if (values.size() != contents.terms.size())
    throw InvalidArgument("compare_bfile_terms: " + std::to_string(values.size()) + " values for " +
                          std::to_string(contents.terms.size()) + " terms");
  BfileComparison c;
  for (std::size_t i = 0; i < values.size(); ++i) {
    const auto& term = contents.terms[i];
    const auto& v = values[i];
    if (v.status == track::TermStatus::beyond_limit) {
      ++c.beyond_limit;
      continue;
    }
    if (v.status == track::TermStatus::outside_domain) {
      ++c.outside_domain;
      continue;
    }
    ++c.compared;
    const std::string got = std::to_string(v.value);
    if (got == term.value) continue;
    ++c.mismatched;
    if (!c.first_mismatch) c.first_mismatch = BfileMismatch{term.line, term.n, term.value, got};
  }
  return c;
}

bool bfile_check_passed(const BfileContents& contents, const BfileComparison& comparison) noexcept {
  return comparison.mismatched == 0 && contents.malformed.empty();
}

void write_bfile_check_report(std::ostream& out, const BfileCheckHeading& h, const BfileContents& contents,
                              const BfileComparison& c, std::size_t max_listed) {
  out << "b-file check\n";
  out << "file: " << h.file << '\n';
  out << "sequence: " << h.sequence << " (" << h.description << ")\n";
  out << "lines read: " << contents.lines << " (" << contents.terms.size() << " terms, " << contents.comments
      << " comments, " << contents.blanks << " blank, " << contents.malformed.size() << " malformed)\n";
  out << "terms compared: " << c.compared << '\n';
  out << "terms skipped: " << c.skipped() << " (" << c.beyond_limit << " need n above " << h.limit << ", "
      << c.outside_domain << " outside the sequence's indices)\n";
  if (c.first_mismatch) {
    const auto& m = *c.first_mismatch;
    out << "values: " << c.mismatched << " of " << c.compared << " differ\n";
    out << "first mismatch: line " << m.line << ", n = " << m.n << ": expected " << m.expected << " (file), got "
        << m.got << " (sqfc)\n";
  } else if (c.compared == 0) {
    out << "values: nothing to compare\n";
  } else {
    out << "values: all equal\n";
  }
  out << "malformed lines: " << contents.malformed.size() << '\n';
  list_items(out, contents.malformed, max_listed, [&](const BfileMalformed& m) {
    out << "line " << m.line << ": " << bfile_problem_text(m.problem) << ": '" << m.text << "'";
  });
  out << "repeated n: " << contents.duplicates.size() << '\n';
  list_items(out, contents.duplicates, max_listed, [&](const BfileDuplicate& d) {
    out << "line " << d.line << ": n = " << d.n << " already on line " << d.first_line;
  });
  out << "n out of order: " << contents.out_of_order.size() << '\n';
  list_items(out, contents.out_of_order, max_listed, [&](const BfileOutOfOrder& o) {
    out << "line " << o.line << ": n = " << o.n << " after n = " << o.previous_n << " on line " << o.previous_line;
  });
  out << "verdict: " << (bfile_check_passed(contents, c) ? "PASS" : "FAIL") << '\n';
}

}  // namespace sqfc::io
