// The text of a CIF as written by real programs, made readable by the CIF 1.1
// grammar (gemmi's parser accepts printable ASCII only) without moving a
// single line, so every position quoted later is a position in the user's file.
//
// Files in the wild carry citations and names in Latin-1 or UTF-8, typographic
// quotes, stray control characters, a Unicode minus in a coordinate and
// unquoted Hermann-Mauguin symbols with spaces. None of these fields decides
// the structure except the minus and the symbol, so:
// - U+2212 (minus) and the hyphen/dash characters U+2010..U+2013 become '-';
// - typographic single and double quotes become ' and ";
// - a no-break space becomes a space;
// - every other byte outside printable ASCII (valid UTF-8 counted as one
//   character, an invalid byte as one) becomes '?';
// - a `_tag value` line whose value runs on as several words (and not into
//   another tag or a comment) gets the value quoted; a quote left open there is
//   left for the parser to name.
// Each kind of repair is reported once, with its first line.
#pragma once

#include <string>
#include <vector>

namespace ts {

struct CifTextRepair {
  std::string text;               // same number of lines as the input
  std::vector<std::string> notes; // one sentence per kind of repair, empty when nothing changed
};

CifTextRepair repair_cif_text(const std::string& raw);

} // namespace ts
