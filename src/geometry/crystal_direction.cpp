#include "geometry/crystal_direction.hpp"

#include "core/error.hpp"

#include <cctype>
#include <vector>

namespace ts {

namespace {
constexpr long kMaxMillerIndex = 1000;
}

std::vector<long> parse_miller_indices(const std::string& body, const std::string& raw, const std::string& where,
                                       const std::string& valid) {
  bool commas = body.find(',') != std::string::npos;
  std::vector<long> idx;
  for (std::size_t i = 0; i < body.size();) {
    if (body[i] == ',' || body[i] == ' ') {
      ++i;
      continue;
    }
    long sign = 1;
    if (body[i] == '-') {
      sign = -1;
      ++i;
    }
    if (i >= body.size() || !std::isdigit(static_cast<unsigned char>(body[i])))
      fail(ErrorKind::bad_geometry, "'" + raw + "': expected a digit at character " + std::to_string(i + 2), where,
           valid);
    long v = 0;
    do {
      v = v * 10 + (body[i] - '0');
      ++i;
      // Real planes and directions have small indices; the bound also keeps the
      // exact arithmetic of metrics and frames built from them far from overflow.
      if (v > kMaxMillerIndex)
        fail(ErrorKind::too_large, "'" + raw + "': index beyond " + std::to_string(kMaxMillerIndex), where,
             valid + ", indices of at most " + std::to_string(kMaxMillerIndex));
    } while (commas && i < body.size() && std::isdigit(static_cast<unsigned char>(body[i])));
    idx.push_back(sign * v);
  }
  return idx;
}

LatticeDirection parse_direction(const std::string& raw, const std::string& where) {
  const std::string valid = "a direction in square brackets: [uvw] such as [1-10], [1,-1,0], or [uvtw] for hexagonal axes";
  std::string text;
  for (char c : raw)
    if (c != ' ') text += c;
  if (text.size() < 2 || text.front() != '[' || text.back() != ']')
    fail(ErrorKind::bad_geometry, "'" + raw + "' is not a direction", where, valid);
  std::string body = text.substr(1, text.size() - 2);
  std::vector<long> idx = parse_miller_indices(body, raw, where, valid);
  LatticeDirection d;
  if (idx.size() == 4) {
    if (idx[2] != -(idx[0] + idx[1]))
      fail(ErrorKind::bad_geometry, "'" + raw + "': in [uvtw] the third index must be t = -(u+v)", where, valid);
    // [UVTW] -> [uvw] = [2U+V, 2V+U, W] (Miller-Bravais to three-index, common practice)
    d.uvw = {2 * idx[0] + idx[1], 2 * idx[1] + idx[0], idx[3]};
  } else if (idx.size() == 3) {
    d.uvw = {idx[0], idx[1], idx[2]};
  } else {
    fail(ErrorKind::bad_geometry, "'" + raw + "' has " + std::to_string(idx.size()) + " indices", where, valid);
  }
  if (d.uvw[0] == 0 && d.uvw[1] == 0 && d.uvw[2] == 0)
    fail(ErrorKind::bad_geometry, "'" + raw + "' is the zero vector", where, valid);
  d.text = direction_str(d.uvw);
  return d;
}

} // namespace ts
