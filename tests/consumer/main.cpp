// A program of someone else's that links the installed library (tests/package_check.sh
// builds it against `cmake --install` output, with CMake and with pkg-config).
// 4mm has 3 independent components of a polar vector's derivative V[V2]
// (piezoelectric-like d_ijk with sym(jk); Nye, Physical Properties of Crystals, 1957,
// the 4mm d-matrix: d15 = d24, d31 = d32, d33; common practice).
#include <tensorsieve/core/error.hpp>
#include <tensorsieve/group/group_catalogue.hpp>
#include <tensorsieve/tensor/allowed_form.hpp>
#include <tensorsieve/tensor/tensor_spec.hpp>

#include <iostream>

int main() {
  try {
    const ts::GroupCatalogue& catalogue = ts::GroupCatalogue::builtin();
    const ts::NamedGroup& g = catalogue.get("4mm", ts::PlainSymbol::nonmagnetic);
    const ts::AllowedForm form = ts::allowed_form(ts::parse_tensor_spec("V[V2]"), g.group);
    std::cout << "4mm V[V2]: " << form.independent() << " independent\n";
    catalogue.get("4mn");
  } catch (const ts::Error& e) {
    std::cout << "error: " << e.problem() << "\n";
    return 0;
  }
  return 1; // "4mn" must have been refused
}
