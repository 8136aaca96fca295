#include "cli/parse_errors.hpp"

#include "core/text.hpp"

#include <algorithm>

namespace ts::cli {

std::vector<std::string> closest_words(const std::string& word, const std::vector<std::string>& candidates) {
  std::vector<std::pair<std::size_t, std::string>> scored;
  for (const auto& c : candidates) {
    std::size_t d = edit_distance(word, c);
    // "--mag" for "--magnetic": a typed beginning is as good as one typo.
    if (word.size() >= 3 && c.compare(0, word.size(), word) == 0) d = std::min<std::size_t>(d, 1);
    // A typo changes about one character in three; beyond that the word is something else.
    const std::size_t limit = std::max<std::size_t>(1, std::min(word.size(), c.size()) / 3);
    if (d <= limit) scored.emplace_back(d, c);
  }
  std::stable_sort(scored.begin(), scored.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
  std::vector<std::string> out;
  for (const auto& [d, c] : scored)
    if (d == scored.front().first && std::find(out.begin(), out.end(), c) == out.end()) out.push_back(c);
  return out;
}

namespace {

std::vector<std::string> subcommand_names(const CLI::App& app) {
  std::vector<std::string> names;
  for (const CLI::App* s : app.get_subcommands([](const CLI::App*) { return true; })) names.push_back(s->get_name());
  return names;
}

std::vector<std::string> option_names(const CLI::App& cmd) {
  std::vector<std::string> names;
  for (const CLI::Option* o : cmd.get_options()) {
    for (const auto& l : o->get_lnames()) names.push_back("--" + l);
    for (const auto& s : o->get_snames()) names.push_back("-" + s);
  }
  return names;
}

std::string did_you_mean(const std::vector<std::string>& near) {
  if (near.empty()) return "";
  return " (did you mean " + join(near, " or ") + "?)";
}

std::string usage_of(const CLI::App& cmd) {
  std::string s = "tensorsieve " + cmd.get_name();
  for (const CLI::Option* o : cmd.get_options())
    if (o->get_positional()) s += " " + o->get_name();
  return s + " [options]";
}

} // namespace

Error parse_error(const CLI::App& app, const CLI::ParseError& e) {
  const std::vector<CLI::App*> parsed = app.get_subcommands();
  const std::vector<std::string> extras = app.remaining(true);
  const std::string subcommands = join(subcommand_names(app), ", ");
  if (parsed.empty()) {
    // Nothing named a subcommand: the first word is a mistyped one, or an option came first.
    const std::string word = extras.empty() ? std::string() : extras.front();
    if (!word.empty() && word.front() != '-')
      return Error(ErrorKind::usage, "unknown subcommand '" + word + "'" + did_you_mean(closest_words(word, subcommand_names(app))),
                   "", "tensorsieve SUBCOMMAND ...; subcommands: " + subcommands + "; `tensorsieve --help` describes them");
    return Error(ErrorKind::usage, word.empty() ? "no subcommand given" : "option '" + word + "' before the subcommand",
                 "", "tensorsieve SUBCOMMAND [options]; subcommands: " + subcommands +
                         "; `tensorsieve --help` describes them");
  }
  const CLI::App& cmd = *parsed.back();
  const std::string where = "tensorsieve " + cmd.get_name();
  const std::string help = "`tensorsieve " + cmd.get_name() + " --help` lists the options";
  if (dynamic_cast<const CLI::ExtrasError*>(&e) && !extras.empty()) {
    const std::string& word = extras.front();
    if (word.size() > 1 && word.front() == '-' && word.find_first_not_of("-.0123456789") != std::string::npos)
      return Error(ErrorKind::usage, "unknown option '" + word + "'" + did_you_mean(closest_words(word, option_names(cmd))),
                   where, "an option of " + cmd.get_name() + "; " + help);
    const std::vector<std::string> names = subcommand_names(app);
    const bool subcommand = std::find(names.begin(), names.end(), word) != names.end();
    return Error(ErrorKind::usage, "unexpected argument '" + word + "'" + (subcommand ? " (one subcommand at a time)" : ""),
                 where, usage_of(cmd) + "; quote a value that contains spaces or brackets; " + help);
  }
  // CLI11's own sentence ("group is required", "--num: 1 required INT missing", "Could
  // not convert: --cut = x") names the option; add the usage and where to read more.
  return Error(ErrorKind::usage, e.what(), where, usage_of(cmd) + "; " + help);
}

} // namespace ts::cli
