#include "response/response_expansion.hpp"

#include "core/error.hpp"
#include "tensor/tensor_spec.hpp"

#include <algorithm>

namespace ts {

int max_expansion_order(const ResponseExpansion& e) { return max_rank - static_cast<int>(e.indices.size()); }

namespace {

// A run of equal drive roles is symmetric (j_b j_c = j_c j_b); so are the field indices.
std::string index_symmetries(const std::vector<std::string>& roles, const std::string& letters, bool first_pair_odd,
                             bool onsager_pair) {
  std::vector<std::string> out;
  if (onsager_pair) out.push_back(std::string(first_pair_odd ? "antisym(" : "sym(") + letters.substr(0, 2) + ")");
  std::size_t i = 1; // the response index stands alone
  while (i < roles.size()) {
    std::size_t j = i;
    while (j + 1 < roles.size() && roles[j + 1] == roles[i]) ++j;
    if (j > i) out.push_back("sym(" + letters.substr(i, j - i + 1) + ")");
    i = j + 1;
  }
  std::string text;
  for (const auto& s : out) text += ", " + s;
  return text;
}

std::string order_words(int q) {
  static const char* names[] = {"zeroth", "first", "second", "third", "fourth", "fifth", "sixth"};
  return q >= 0 && q <= 6 ? names[q] : std::to_string(q) + "th";
}

} // namespace

std::vector<ResponsePart> expansion_parts(const ResponseExpansion& e, int order, const std::string& where,
                                          ErrorKind bad_value) {
  const int most = max_expansion_order(e);
  if (order < 1 || order > most)
    fail(bad_value, "expansion order " + std::to_string(order) + " is out of range", where,
         "an order from 1 to " + std::to_string(most) + " (a tensor spec has rank at most " +
             std::to_string(max_rank) + ")");
  const std::string letters = "abcdefghi";
  // One drive and the response: a linear transport coefficient, which obeys Onsager-Kleiner.
  const bool onsager_pair = e.indices.size() == 2 && (e.indices[1] == "j" || e.indices[1] == "E");
  std::vector<ResponsePart> out;
  for (int q = 1; q <= order; ++q) {
    std::vector<std::string> roles = e.indices;
    for (int k = 0; k < q; ++k) roles.push_back(e.field);
    const bool axial = e.axial != (q % 2 == 1); // B and M are axial vectors
    for (bool c_type : {false, true}) {
      ResponsePart p;
      p.indices = roles;
      p.harmonic = e.harmonic;
      p.drive = e.drive;
      p.expansion_order = q;
      p.where = e.where;
      // ρ_ab(m) = ρ_ba(-m): the i-type coefficient of m^q is (anti)symmetric for q even (odd).
      const bool first_pair_odd = (q % 2 == 1) != c_type;
      const std::string idx = letters.substr(0, roles.size());
      p.spec_text = "c_" + idx + ": " + (axial ? "axial" : "polar") + ", " + (c_type ? "time-odd" : "time-even") +
                    index_symmetries(roles, idx, first_pair_odd, onsager_pair);
      p.spec = parse_tensor_spec(p.spec_text);
      const std::string quantity = e.field == "M" ? "m" : "B";
      p.label = order_words(q) + " order in " + quantity + ", " + (c_type ? "c-type" : "i-type");
      auto named = std::find_if(e.terms.begin(), e.terms.end(),
                                [&](const ExpansionTerm& t) { return t.order == q && t.c_type == c_type; });
      if (named != e.terms.end()) p.mechanism = named->mechanism;
      else if (c_type)
        p.mechanism = "odd under time reversal of the host: needs magnetic order beyond " + quantity;
      else
        p.mechanism = "allowed by symmetry at this order; no standard name";
      out.push_back(std::move(p));
    }
  }
  return out;
}

} // namespace ts
