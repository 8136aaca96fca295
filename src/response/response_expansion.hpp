// A response expanded in powers of the field or of the magnetisation direction
// to any order: E_a = Σ_q c^(q)_{a b.. d1..dq} j_b.. m_d1..m_dq. The catalogue
// states the order-0 roles (response and drives), which quantity is expanded
// and the default order; the parts of each order are generated, symmetric in
// the field indices (and in repeated drive indices), axial when q is odd for an
// axial field, with an i-type and a c-type part each. For a linear response
// (one drive) Onsager-Kleiner fixes the exchange symmetry of the first pair:
// c^(q)_ab = (-1)^q c^(q)_ba for the i-type coefficient, the opposite for the
// c-type one (docs/responses.md).
#pragma once

#include "response/response_catalogue.hpp"

#include <string>
#include <vector>

namespace ts {

// The highest order a response can be expanded to: the rank limit of a spec
// less the order-0 roles.
int max_expansion_order(const ResponseExpansion& e);

// The parts of orders 1..order (i-type first at each order), labelled and
// described from the expansion's named terms. Throws Error(bad_value kind
// given) naming `where` when the order is out of range.
std::vector<ResponsePart> expansion_parts(const ResponseExpansion& e, int order, const std::string& where,
                                          ErrorKind bad_value);

} // namespace ts
