#include "tensor/tensor_spec.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <cctype>
#include <numeric>

namespace ts {

namespace {

const char* index_syntax_help =
    "name_indices: modifiers, e.g. \"d_ijk: polar, sym(jk)\", \"sigma_ab: onsager(a,b)\", "
    "\"c_ijkl: sym(ij), sym(kl), sym(ij,kl)\"; modifiers: polar | axial, time-even (i-type) | time-odd (c-type), "
    "sym(...), antisym(...), onsager(...); or a Jahn symbol such as V, aeV, [V2], V[V2], [[V2]2], a{V2}";

[[noreturn]] void spec_error(const std::string& text, std::size_t pos, const std::string& what) {
  std::string marker(pos, ' ');
  fail(ErrorKind::bad_spec, "tensor spec '" + text + "', at character " + std::to_string(pos + 1) + ": " + what +
                                "\n    " + text + "\n    " + marker + "^",
       "", index_syntax_help);
}

void check_rank(int rank, const std::string& text) {
  if (rank > max_rank)
    fail(ErrorKind::too_large,
         "tensor spec '" + text + "' has rank " + std::to_string(rank) + "; tensorsieve handles rank 0 to " +
             std::to_string(max_rank),
         "", "a tensor of rank at most 6 (3^6 = 729 components)");
}

std::string letters_of(const std::string& letters, const std::vector<int>& positions) {
  std::string s;
  for (int p : positions) s += letters[p];
  return s;
}

// Generators making the listed blocks (equal-size position lists) interchangeable.
void add_block_symmetry(TensorSpec& spec, const std::vector<std::vector<int>>& blocks, int sign) {
  for (std::size_t b = 0; b + 1 < blocks.size(); ++b) {
    IndexPermutation p;
    p.perm.resize(spec.rank);
    std::iota(p.perm.begin(), p.perm.end(), 0);
    for (std::size_t k = 0; k < blocks[b].size(); ++k) std::swap(p.perm[blocks[b][k]], p.perm[blocks[b + 1][k]]);
    p.sign = sign;
    spec.symmetries.push_back(p);
  }
  std::string t = sign > 0 ? "sym(" : "antisym(";
  bool singles = std::all_of(blocks.begin(), blocks.end(), [](const auto& b) { return b.size() == 1; });
  for (std::size_t b = 0; b < blocks.size(); ++b) {
    if (b && !singles) t += ",";
    t += letters_of(spec.letters, blocks[b]);
  }
  spec.symmetry_text.push_back(t + ")");
}

// ---- Jahn symbols -------------------------------------------------------------
struct JahnParser {
  const std::string& text;
  std::size_t pos = 0;
  int depth = 0;
  static constexpr int kMaxNesting = 3;
  TensorSpec spec;

  struct Block {
    int size = 0;
    // symmetries relative to the block start, applied for every copy
    std::vector<std::pair<std::vector<std::vector<int>>, int>> syms;
  };

  char peek() const { return pos < text.size() ? text[pos] : '\0'; }
  int exponent() {
    // "2", "^2", or a UTF-8 superscript ², ³, ⁴, ⁵, ⁶
    if (peek() == '^') ++pos;
    if (std::isdigit(static_cast<unsigned char>(peek()))) return text[pos++] - '0';
    if (pos + 1 < text.size() && static_cast<unsigned char>(text[pos]) == 0xC2) {
      unsigned char c = static_cast<unsigned char>(text[pos + 1]);
      if (c == 0xB2 || c == 0xB3) {
        pos += 2;
        return c == 0xB2 ? 2 : 3;
      }
    }
    if (pos + 2 < text.size() && static_cast<unsigned char>(text[pos]) == 0xE2 &&
        static_cast<unsigned char>(text[pos + 1]) == 0x81) {
      unsigned char c = static_cast<unsigned char>(text[pos + 2]);
      if (c >= 0xB4 && c <= 0xB9) {
        pos += 3;
        return 4 + (c - 0xB4);
      }
    }
    return 1;
  }
  static void shift_into(Block& dst, const Block& src, int offset) {
    for (const auto& [blocks, sign] : src.syms) {
      std::vector<std::vector<int>> moved = blocks;
      for (auto& b : moved)
        for (auto& p : b) p += offset;
      dst.syms.emplace_back(moved, sign);
    }
  }
  Block factor() {
    char c = peek();
    if (c == 'V') {
      ++pos;
      Block b;
      b.size = 1;
      return b;
    }
    if (c == '[' || c == '{') {
      // Each bracket at least doubles the rank, so three levels already pass rank 6;
      // the bound keeps hostile input such as [[[[...V...]]]] off the stack.
      if (++depth > kMaxNesting)
        fail(ErrorKind::too_large,
             "tensor spec '" + text + "' nests brackets deeper than " + std::to_string(kMaxNesting) +
                 " levels, beyond rank " + std::to_string(max_rank),
             "", "a tensor of rank at most 6, such as [[V2]2] or V[V2]");
      std::size_t open = pos++;
      char close = c == '[' ? ']' : '}';
      Block base = factor();
      --depth;
      int k = exponent();
      if (k < 2) spec_error(text, pos, std::string("expected a power of 2 or more inside '") + c + "'");
      if (peek() != close) spec_error(text, pos, std::string("expected '") + close + "' to close '" + c + "' at " + std::to_string(open + 1));
      ++pos;
      Block b;
      b.size = base.size * k;
      check_rank(b.size, text); // before building copies: nested powers grow fast
      std::vector<std::vector<int>> copies;
      for (int i = 0; i < k; ++i) {
        std::vector<int> blk(base.size);
        std::iota(blk.begin(), blk.end(), i * base.size);
        copies.push_back(blk);
        shift_into(b, base, i * base.size);
      }
      b.syms.emplace_back(copies, c == '[' ? 1 : -1);
      return b;
    }
    spec_error(text, pos, std::string("expected V, [ or {") + (c ? std::string(", found '") + c + "'" : ""));
  }
  TensorSpec run() {
    while (peek() == 'a' || peek() == 'e') {
      if (peek() == 'a') spec.time_odd = !spec.time_odd;
      else spec.axial = !spec.axial;
      ++pos;
    }
    Block whole;
    while (pos < text.size()) {
      Block f = factor();
      int k = exponent();
      check_rank(whole.size + f.size * k, text);
      for (int i = 0; i < k; ++i) {
        shift_into(whole, f, whole.size);
        whole.size += f.size;
      }
    }
    if (whole.size == 0 && text.empty()) spec_error(text, 0, "empty spec");
    spec.rank = whole.size;
    check_rank(spec.rank, text);
    spec.letters = std::string("ijklmn").substr(0, spec.rank);
    spec.jahn = text;
    for (const auto& [blocks, sign] : whole.syms) add_block_symmetry(spec, blocks, sign);
    return spec;
  }
};

// ---- our index syntax -----------------------------------------------------------
std::string trim(const std::string& s) {
  std::size_t a = s.find_first_not_of(" \t"), b = s.find_last_not_of(" \t");
  return a == std::string::npos ? "" : s.substr(a, b - a + 1);
}

} // namespace

TensorSpec parse_jahn_symbol(const std::string& text) {
  JahnParser p{text, 0, 0, TensorSpec{}};
  return p.run();
}

TensorSpec parse_index_spec(const std::string& text) {
  TensorSpec spec;
  std::size_t colon = text.find(':');
  std::string head = trim(text.substr(0, colon));
  std::size_t head_start = text.find_first_not_of(" \t");
  if (head.empty()) spec_error(text, 0, "expected index letters such as ijk");
  std::size_t us = head.rfind('_');
  if (us != std::string::npos) {
    spec.name = head.substr(0, us);
    spec.letters = head.substr(us + 1);
    if (spec.name.empty()) spec_error(text, head_start, "empty tensor name before '_'");
  } else {
    spec.letters = head;
  }
  std::size_t letters_at = head_start + (us == std::string::npos ? 0 : us + 1);
  for (std::size_t i = 0; i < spec.letters.size(); ++i) {
    char c = spec.letters[i];
    if (!std::islower(static_cast<unsigned char>(c)))
      spec_error(text, letters_at + i,
                 c == ' ' ? "expected ':' between the indices and the modifiers (d_ijk: polar, sym(jk))"
                 : c == '[' || c == '{'
                     ? "index letters are lowercase a-z; a Jahn symbol is written with a capital V, e.g. [V2]"
                     : "index letters are lowercase a-z");
    if (spec.letters.find(c) != i) spec_error(text, letters_at + i, std::string("index '") + c + "' appears twice");
  }
  for (char c : spec.name)
    if (!std::isalnum(static_cast<unsigned char>(c)))
      spec_error(text, head_start, "a tensor name is letters and digits");
  spec.rank = static_cast<int>(spec.letters.size());
  check_rank(spec.rank, text);
  if (colon == std::string::npos) return spec;

  std::size_t pos = colon + 1;
  auto skip = [&] {
    while (pos < text.size() && (text[pos] == ' ' || text[pos] == ',' || text[pos] == '\t')) ++pos;
  };
  bool saw_parity = false, saw_time = false;
  for (skip(); pos < text.size(); skip()) {
    std::size_t start = pos;
    while (pos < text.size() && (std::isalpha(static_cast<unsigned char>(text[pos])) || text[pos] == '-')) ++pos;
    std::string word = text.substr(start, pos - start);
    if (word.empty()) spec_error(text, start, "expected a modifier");
    if (word == "polar" || word == "axial") {
      if (saw_parity) spec_error(text, start, "polar/axial given twice");
      saw_parity = true;
      spec.axial = word == "axial";
      continue;
    }
    if (word == "time-even" || word == "i-type" || word == "time-odd" || word == "c-type") {
      if (saw_time) spec_error(text, start, "time-even/time-odd given twice");
      saw_time = true;
      spec.time_odd = word == "time-odd" || word == "c-type";
      continue;
    }
    if (word != "sym" && word != "antisym" && word != "onsager")
      spec_error(text, start, "unknown modifier '" + word + "'");
    if (pos >= text.size() || text[pos] != '(') spec_error(text, pos, "expected '(' after " + word);
    std::size_t close = text.find(')', pos);
    if (close == std::string::npos) spec_error(text, pos, "unclosed '('");
    std::vector<std::vector<int>> groups;
    std::vector<int> cur;
    std::vector<bool> used(spec.rank, false);
    for (std::size_t i = pos + 1; i <= close; ++i) {
      char c = text[i];
      if (c == ',' || c == ')') {
        if (cur.empty()) spec_error(text, i, "empty index group");
        groups.push_back(cur);
        cur.clear();
        continue;
      }
      if (c == ' ') continue;
      std::size_t at = spec.letters.find(c);
      if (at == std::string::npos || !std::islower(static_cast<unsigned char>(c)))
        spec_error(text, i, std::string("'") + c + "' is not one of the indices " + spec.letters);
      if (used[at]) spec_error(text, i, std::string("index '") + c + "' used twice here");
      used[at] = true;
      cur.push_back(static_cast<int>(at));
    }
    pos = close + 1;
    if (groups.size() == 1) { // sym(jkl): every index its own group
      std::vector<std::vector<int>> singles;
      for (int p : groups[0]) singles.push_back({p});
      groups = singles;
    }
    if (groups.size() < 2) spec_error(text, start, word + "(...) needs at least two indices or groups");
    for (const auto& g : groups)
      if (g.size() != groups[0].size()) spec_error(text, start, "the exchanged index groups must have equal length");
    if (word == "onsager") {
      if (groups.size() != 2) spec_error(text, start, "onsager(...) exchanges exactly two index groups");
      if (!spec.onsager.empty()) spec_error(text, start, "onsager(...) given twice");
      spec.onsager.resize(spec.rank);
      std::iota(spec.onsager.begin(), spec.onsager.end(), 0);
      for (std::size_t k = 0; k < groups[0].size(); ++k) std::swap(spec.onsager[groups[0][k]], spec.onsager[groups[1][k]]);
      continue;
    }
    add_block_symmetry(spec, groups, word == "sym" ? 1 : -1);
  }
  return spec;
}

TensorSpec parse_tensor_spec(const std::string& raw) {
  std::string text = trim(raw);
  if (text.empty()) spec_error(raw, 0, "empty tensor spec");
  if (text == "scalar" || text == "1") {
    TensorSpec s;
    s.jahn = "1";
    return s;
  }
  // Jahn's scalars carry no V: "e" (pseudoscalar), "a" (time-odd scalar), "ae".
  if (text.size() <= 2 && text.find_first_not_of("ae") == std::string::npos &&
      (text.size() == 1 || text[0] != text[1])) {
    TensorSpec s;
    s.axial = text.find('e') != std::string::npos;
    s.time_odd = text.find('a') != std::string::npos;
    s.jahn = text;
    return s;
  }
  bool index_style = text.find(':') != std::string::npos || text.find('_') != std::string::npos ||
                     std::all_of(text.begin(), text.end(), [](char c) { return std::islower(static_cast<unsigned char>(c)); });
  bool jahn_style = text.find('V') != std::string::npos;
  if (jahn_style && !index_style) return parse_jahn_symbol(text);
  return parse_index_spec(text);
}

std::string TensorSpec::description() const {
  std::string s = "rank " + std::to_string(rank) + ", " + (axial ? "axial" : "polar") + ", " +
                  (time_odd ? "time-odd (c-type)" : "time-even (i-type)");
  for (const auto& t : symmetry_text) s += ", " + t;
  if (!onsager.empty()) {
    std::string a, b;
    for (int p = 0; p < rank; ++p)
      if (onsager[p] != p && p < onsager[p]) {
        a += letters[p];
        b += letters[onsager[p]];
      }
    s += ", onsager(" + a + "," + b + ")";
  }
  return s;
}

std::string TensorSpec::canonical_text() const {
  std::string s = name + "_" + letters + ": " + (axial ? "axial" : "polar") + ", " + (time_odd ? "time-odd" : "time-even");
  for (const auto& t : symmetry_text) s += ", " + t;
  if (!onsager.empty()) {
    std::string a, b;
    for (int p = 0; p < rank; ++p)
      if (onsager[p] != p && p < onsager[p]) {
        a += letters[p];
        b += letters[onsager[p]];
      }
    s += ", onsager(" + a + "," + b + ")";
  }
  return s;
}

} // namespace ts
