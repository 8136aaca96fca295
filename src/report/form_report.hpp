// The report of one allowed form: which group and setting, which frame, which
// tensor, the free parameters and every component, with the contracted views
// the trade uses (3x3 matrix, 3x6 d-matrix, 6x6 Voigt).
#pragma once

#include "group/group_catalogue.hpp"
#include "report/json_text.hpp"
#include "report/report_format.hpp"
#include "tensor/allowed_form.hpp"

#include <array>
#include <string>
#include <vector>


namespace ts {

struct GroupContext {
  std::string symbol, type_symbol, schoenflies, kind, setting;
  std::size_t order = 0;
  std::vector<std::string> operations; // symbols in the group's lattice basis
  static GroupContext of(const NamedGroup& g);
};

struct FrameContext {
  std::array<std::string, 3> axes{"[100]", "[010]", "[001]"}; // crystal directions of x, y, z
  bool crystal_frame = true;
};

enum class View { automatic, components, matrix, dmatrix, voigt };
View parse_view(const std::string& name); // throws Error(usage)

std::string write_form(const AllowedForm& form, const GroupContext& group, const FrameContext& frame, Format format,
                       View view = View::automatic);

// The JSON object of one form (schema in docs/json-schema.md), for embedding in larger reports.
void form_json(const AllowedForm& form, const GroupContext& group, const FrameContext& frame, toml::table& out);

// Which contracted views fit this form's index symmetry.
bool has_dmatrix_view(const AllowedForm& form);
bool has_voigt_view(const AllowedForm& form);

} // namespace ts
