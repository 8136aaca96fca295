// Running the built tensorsieve executable from a test: arguments are quoted
// for /bin/sh, standard output and error go to files in a private temporary
// directory, and the exit status is decoded with WEXITSTATUS.
#pragma once

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <stdexcept>
#include <string>
#include <sys/wait.h>
#include <utility>
#include <vector>

namespace ts::test {

// A fresh directory under the system temporary directory, removed with its contents.
class TempDir {
public:
  TempDir() {
    std::string tmpl = (std::filesystem::temp_directory_path() / "tensorsieve-test-XXXXXX").string();
    if (!::mkdtemp(tmpl.data())) throw std::runtime_error("mkdtemp failed for " + tmpl);
    path_ = tmpl;
  }
  ~TempDir() {
    std::error_code ec;
    std::filesystem::remove_all(path_, ec);
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  const std::filesystem::path& path() const { return path_; }
  std::filesystem::path operator/(const std::string& name) const { return path_ / name; }

private:
  std::filesystem::path path_;
};

inline std::string shell_quote(const std::string& s) {
  std::string q = "'";
  for (char c : s) q += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return q + "'";
}

inline std::string read_file(const std::filesystem::path& p) {
  std::ifstream in(p, std::ios::binary);
  return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
}

struct CliResult {
  int exit_code = -1; // -1 when the process did not exit normally (signal)
  std::string out, err;
};

// env: extra variables for this run only, e.g. {{"TENSORSIEVE_DATA", dir}}.
inline CliResult run_cli(const std::vector<std::string>& args,
                         const std::vector<std::pair<std::string, std::string>>& env = {}) {
  TempDir io;
  std::string cmd = "env";
  for (const auto& [k, v] : env) cmd += " " + shell_quote(k + "=" + v);
  cmd += " " + shell_quote(TENSORSIEVE_BINARY);
  for (const auto& a : args) cmd += " " + shell_quote(a);
  cmd += " </dev/null >" + shell_quote((io / "out").string()) + " 2>" + shell_quote((io / "err").string());
  const int status = std::system(cmd.c_str());
  CliResult r;
  if (status != -1 && WIFEXITED(status)) r.exit_code = WEXITSTATUS(status);
  r.out = read_file(io / "out");
  r.err = read_file(io / "err");
  return r;
}

// Several independent runs at once (one shell, background jobs, then wait), to
// keep the tests that repeat many commands fast on a multi-core machine.
inline std::vector<CliResult> run_cli_batch(const std::vector<std::vector<std::string>>& commands) {
  TempDir io;
  std::string script;
  for (std::size_t i = 0; i < commands.size(); ++i) {
    const std::string n = std::to_string(i);
    std::string cmd = shell_quote(TENSORSIEVE_BINARY);
    for (const auto& a : commands[i]) cmd += " " + shell_quote(a);
    script += "( " + cmd + " </dev/null >" + shell_quote((io / ("out" + n)).string()) + " 2>" +
              shell_quote((io / ("err" + n)).string()) + "; echo $? >" + shell_quote((io / ("rc" + n)).string()) +
              " ) & ";
  }
  script += "wait";
  const int status = std::system(("sh -c " + shell_quote(script)).c_str());
  std::vector<CliResult> results(commands.size());
  if (status == -1) return results; // exit codes stay -1: every check on them fails
  for (std::size_t i = 0; i < commands.size(); ++i) {
    const std::string n = std::to_string(i);
    const std::string rc = read_file(io / ("rc" + n));
    if (!rc.empty()) results[i].exit_code = std::stoi(rc);
    results[i].out = read_file(io / ("out" + n));
    results[i].err = read_file(io / ("err" + n));
  }
  return results;
}

// Names of the entries of a directory, for "nothing was left behind" checks.
inline std::vector<std::string> directory_entries(const std::filesystem::path& dir) {
  std::vector<std::string> names;
  for (const auto& e : std::filesystem::directory_iterator(dir)) names.push_back(e.path().filename().string());
  return names;
}

} // namespace ts::test
