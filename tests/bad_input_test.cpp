// The bad-input corpus (tests/bad_input/cases.txt): every case ends in its exit code
// with one clear message on standard error naming what was wrong; never a crash, a
// hang, an internal error, output on standard output, or a report file left behind.
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <map>
#include <sstream>

namespace {

using ts::test::shell_quote;
using ts::test::TempDir;

struct Case {
  std::string name, args, env, expect;
  int exit = -1;
  bool add_output = true;
  int line = 0;
};

std::vector<Case> load_cases(const std::string& path) {
  std::ifstream in(path);
  std::vector<Case> cases;
  std::string line;
  int n = 0;
  while (std::getline(in, line)) {
    ++n;
    if (line.empty() || line[0] == '#') continue;
    std::size_t colon = line.find(':');
    if (colon == std::string::npos) continue;
    std::string key = line.substr(0, colon), value = line.substr(colon + 1);
    value.erase(0, value.find_first_not_of(' '));
    while (!value.empty() && value.back() == ' ') value.pop_back();
    if (key == "case") {
      cases.push_back({});
      cases.back().name = value;
      cases.back().line = n;
    } else if (cases.empty()) {
      continue;
    } else if (key == "args") {
      cases.back().args = value;
    } else if (key == "env") {
      cases.back().env = value;
    } else if (key == "exit") {
      cases.back().exit = std::stoi(value);
    } else if (key == "expect") {
      cases.back().expect = value;
    } else if (key == "output") {
      cases.back().add_output = value != "none";
    }
  }
  return cases;
}

// Words of an args line: spaces separate, "..." groups (the quotes are removed).
std::vector<std::string> split_words(const std::string& s) {
  std::vector<std::string> words;
  std::string cur;
  bool quoted = false, any = false;
  for (char c : s) {
    if (c == '"') {
      quoted = !quoted;
      any = true;
    } else if (c == ' ' && !quoted) {
      if (any) words.push_back(cur);
      cur.clear();
      any = false;
    } else {
      cur += c;
      any = true;
    }
  }
  if (any) words.push_back(cur);
  return words;
}

std::string substitute(std::string s, const std::map<std::string, std::string>& vars) {
  for (const auto& [k, v] : vars)
    for (std::size_t p = s.find(k); p != std::string::npos; p = s.find(k, p + v.size())) s.replace(p, k.size(), v);
  return s;
}

bool valid_utf8(const std::string& s) {
  for (std::size_t i = 0; i < s.size();) {
    unsigned char c = static_cast<unsigned char>(s[i]);
    std::size_t len = c < 0x80 ? 1 : (c >> 5) == 0x6 ? 2 : (c >> 4) == 0xE ? 3 : (c >> 3) == 0x1E ? 4 : 0;
    if (len == 0 || i + len > s.size()) return false;
    for (std::size_t k = 1; k < len; ++k)
      if ((static_cast<unsigned char>(s[i + k]) & 0xC0) != 0x80) return false;
    i += len;
  }
  return true;
}

} // namespace

TEST_CASE("bad-input corpus: clean message and exit code for every case", "[bad_input]") {
  const std::string corpus = std::string(TENSORSIEVE_SOURCE_DIR) + "/tests/bad_input";
  const std::vector<Case> cases = load_cases(corpus + "/cases.txt");
  REQUIRE(cases.size() >= 50);
  std::map<std::string, int> seen;
  for (const auto& c : cases) {
    INFO("case " << c.name << " (tests/bad_input/cases.txt:" << c.line << ")");
    REQUIRE(seen[c.name]++ == 0);
    REQUIRE(c.exit > 0);
    REQUIRE(!c.expect.empty());
    TempDir work, io;
    const std::map<std::string, std::string> vars{{"{corpus}", corpus}, {"{work}", work.path().string()}};
    std::vector<std::string> words = split_words(substitute(c.args, vars));
    const std::string report = (work / "report.out").string();
    if (c.add_output) {
      words.push_back("-o");
      words.push_back(report);
    }
    // `timeout` turns a hang into a failure (exit 124) instead of a stuck suite.
    std::string cmd = "cd " + shell_quote(work.path().string()) + " && env";
    if (!c.env.empty()) cmd += " " + shell_quote(substitute(c.env, vars));
    cmd += " timeout 60 " + shell_quote(TENSORSIEVE_BINARY);
    for (const auto& w : words) cmd += " " + shell_quote(w);
    cmd += " </dev/null >" + shell_quote((io / "out").string()) + " 2>" + shell_quote((io / "err").string());
    const int status = std::system(cmd.c_str());
    REQUIRE(WIFEXITED(status));
    const int code = WEXITSTATUS(status);
    const std::string out = ts::test::read_file(io / "out"), err = ts::test::read_file(io / "err");
    INFO("stderr: " << err);
    CHECK(code == c.exit);
    CHECK(err.find(c.expect) != std::string::npos);
    CHECK(out.empty());
    CHECK(valid_utf8(err));
    CHECK(err.find("internal error") == std::string::npos);
    CHECK(err.size() < 4000);
    // nothing written: no report, no temporary file beside it
    CHECK(ts::test::directory_entries(work.path()).empty());
  }
}

TEST_CASE("bad-input corpus: very long input is not echoed at length", "[bad_input]") {
  const std::string spec(5000, 'V');
  const auto r = ts::test::run_cli({"form", "4mm", spec});
  CHECK(r.exit_code == 8);
  CHECK(r.out.empty());
  CHECK(r.err.size() < 2000);
  CHECK(r.err.find("...") != std::string::npos);
}

TEST_CASE("bad-input corpus: a cut-off multi-byte character never reaches the terminal", "[bad_input]") {
  // 'é' is two bytes; a message quoting one of them alone would be invalid UTF-8.
  const auto r = ts::test::run_cli({"form", "4mm", "V\xC3"});
  CHECK(r.exit_code == 4);
  CHECK(valid_utf8(r.err));
}
