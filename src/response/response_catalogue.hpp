// The response catalogue: physical effects by name ("anomalous-hall", "shg")
// turned into the tensor specs whose allowed forms answer "may this crystal
// show it?", with the time-reversal and Onsager rules, drives, harmonic and
// published source of each. The data live in src/response/catalogue.toml
// (schema in docs/responses.md); every spec is parsed when the file loads, so a
// bad entry fails at start-up with its file, line and id.
#pragma once

#include "group/point_group.hpp"
#include "tensor/allowed_form.hpp"
#include "tensor/tensor_spec.hpp"

#include <cstdint>
#include <memory>
#include <optional>
#include <map>
#include <string>
#include <string_view>
#include <vector>

namespace ts {

// How a transport part meets a Hall bar: as the answer to a driven current
// (E = rho·j, resistivity type) or to a driving field (j = sigma·E).
enum class DriveKind { none, current, field };

struct ResponsePart {
  std::string label, spec_text, mechanism;
  TensorSpec spec;
  std::vector<std::string> indices; // role of each index: response first, then drives (response_index_roles())
                                    // "joule": the Joule-heating gradient of T along the sample normal, ∝ I²
  int harmonic = 0;                 // power of the drive: highest harmonic it produces (0: static)
  DriveKind drive = DriveKind::none;
  bool hall = false; // dissipationless (j·E = 0)
  // A piece of `spec` that cannot reach the measured quantity, e.g. the trace
  // of the dipole D in j = E × (Dᵀ E). It must be an O(3)- and time-reversal-
  // invariant summand of `spec`, so that in every group the allowed count of
  // the part is count(spec) - count(excluded), exactly.
  std::string excluded_text;
  std::optional<TensorSpec> excluded;
  std::string where; // file:line of the [[response.part]] table
};

struct Response {
  std::string id, name, relation, response, harmonic, time_reversal, onsager, source, status;
  std::vector<std::string> aliases, drives;
  std::vector<ResponsePart> parts;
  std::string where; // file:line of the [[response]] table
};

class ResponseCatalogue {
public:
  // Throws Error(bad_file) with file:line:column for TOML errors, unknown or
  // missing keys, bad values and bad specs (naming the entry id).
  static std::unique_ptr<ResponseCatalogue> load(const std::string& path);
  // The catalogue at response_catalogue_path() (src/core/data_dir.hpp), loaded once.
  static const ResponseCatalogue& builtin();
  // The catalogue at `path`: from the table built into the library when the files
  // match it (response_table.hpp), else loaded from them.
  static std::unique_ptr<ResponseCatalogue> load_with_table(const std::string& path);
  // The catalogue as a build-time table, and back; `path` is where the catalogue
  // file is, so positions in messages name it.
  std::string table_text(std::uint64_t fingerprint) const;
  static std::unique_ptr<ResponseCatalogue> from_table(std::string_view table, const std::string& path);

  const std::vector<Response>& responses() const { return responses_; }
  const std::string& path() const { return path_; }
  // By id or alias; case, spaces and underscores are ignored ("Anomalous Hall" finds anomalous-hall).
  const Response* find(const std::string& id_or_alias) const;
  // Throws Error(unknown_name) listing the closest ids.
  const Response& get(const std::string& id_or_alias) const;
  std::vector<std::string> closest_ids(const std::string& id_or_alias, std::size_t how_many = 5) const;
  // "all", a family of families.toml ("transport", "optics", "equilibrium") or one id or
  // alias: the catalogue ids it stands for, in catalogue order.
  std::vector<std::string> expand(const std::string& id_family_or_alias) const;
  const std::map<std::string, std::vector<std::string>>& families() const { return families_; }

private:
  void load_families(const std::string& path);
  std::vector<Response> responses_;
  std::map<std::string, std::vector<std::string>> families_;
  std::string path_;
};

// The values the schema accepts, for messages and docs.
const std::vector<std::string>& response_harmonics(); // 1ω, 2ω, 3ω, DC, 2ω+DC, static
const std::vector<std::string>& response_drives();    // E, B, M, j, H, gradT, light, stress, strain, temperature
const std::vector<std::string>& response_statuses();  // checked, title checked, from memory, common practice
const std::vector<std::string>& response_index_roles(); // E, j, h, B, M, S, Js, P, H, light, k, g, Q, ..., joule, helicity
const char* drive_kind_name(DriveKind k);              // "current", "field", ""
// "Anomalous Hall" -> "anomalous-hall".
std::string normalise_response_key(const std::string& s);

// Independent components a part contributes in a group: count(spec) - count(excluded).
int independent_count(const ResponsePart& part, const PointGroup& group);

// One part evaluated in one group and frame.
struct PartForm {
  const ResponsePart* part = nullptr;
  AllowedForm form;  // of part->spec, in the requested frame
  int excluded = 0;  // independent components of part->excluded (0 when it has none)

  int independent() const { return form.independent() - excluded; }
  bool allowed() const { return independent() > 0; }
  // "allowed: 3 independent components", "forbidden", with a note on an excluded piece.
  std::string verdict() const;
};

std::vector<PartForm> response_forms(const Response& r, const PointGroup& group, const Frame& frame = Frame{});

} // namespace ts
