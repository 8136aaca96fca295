#include "scenario/screening.hpp"

#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "response/response_catalogue.hpp"
#include "scenario/scenario_run.hpp"
#include "scenario/screen_journal.hpp"
#include "scenario/worker_processes.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <mutex>
#include <optional>
#include <thread>

namespace ts {

namespace {

namespace fs = std::filesystem;

bool is_structure_file(const fs::path& p) {
  std::string ext = p.extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return ext == ".cif" || ext == ".mcif";
}

void add_path(const fs::path& p, const std::string& where, std::vector<std::string>* out) {
  std::error_code ec;
  if (fs::is_directory(p, ec)) {
    std::vector<std::string> found;
    for (const auto& e : fs::directory_iterator(p, ec))
      if (e.is_regular_file() && is_structure_file(e.path())) found.push_back(e.path().string());
    std::sort(found.begin(), found.end());
    out->insert(out->end(), found.begin(), found.end());
    return;
  }
  if (!fs::exists(p, ec))
    fail(ErrorKind::bad_file, "no such file or folder: " + p.string(), where,
         "a CIF or mCIF file, a folder of them, or @list.txt with one path per line");
  out->push_back(p.string());
}

// What a row says that depends on the point group alone (in its crystal
// frame, with the lattice lengths a cut needs): files of one group share it, so
// each group is worked out once per run.
struct GroupAnswer {
  std::string point_group, setting;
  std::vector<std::string> cut_groups;
  std::vector<std::vector<int>> counts;
};

class GroupCache {
public:
  std::optional<GroupAnswer> find(const std::string& key) {
    std::lock_guard<std::mutex> lock(mutex_);
    auto it = answers_.find(key);
    if (it == answers_.end()) return std::nullopt;
    return it->second;
  }
  void keep(const std::string& key, const GroupAnswer& a) {
    std::lock_guard<std::mutex> lock(mutex_);
    answers_.emplace(key, a);
  }

private:
  std::mutex mutex_;
  std::map<std::string, GroupAnswer> answers_;
};

// The point operations (Cartesian, time reversal) in a fixed order, and for
// cuts the lattice lengths that fix the film normal.
std::string group_key(const CrystalStructure& st, const StructureSymmetry& sym, bool with_lattice) {
  std::vector<std::string> ops;
  char buf[64];
  for (const auto& op : sym.point_operations) {
    std::string o = op.time_reversal ? "'" : "";
    for (const auto& row : op.rotation_cartesian)
      for (double v : row) {
        std::snprintf(buf, sizeof buf, "%.12g,", v == 0 ? 0.0 : v);
        o += buf;
      }
    ops.push_back(o);
  }
  std::sort(ops.begin(), ops.end());
  std::string key = st.magnetic ? "m|" : "n|";
  for (const auto& o : ops) key += o + ";";
  if (with_lattice) {
    key += st.rhombohedral_axes ? "|r" : "|h";
    for (const auto& row : st.lattice) {
      double len = 0;
      for (double v : row) len += v * v;
      std::snprintf(buf, sizeof buf, "|%.9g", std::sqrt(len));
      key += buf;
    }
  }
  return key;
}

ScreenRow screen_one(const std::string& file, const ScreenRequest& request, GroupCache* cache) {
  ScreenRow row;
  row.file = file;
  try {
    Scenario sc;
    sc.source = file;
    sc.structure = read_structure_file(file, request.options);
    sc.structure_symmetry = find_structure_symmetry(*sc.structure);
    sc.responses = request.responses;
    const StructureSymmetry& sym = *sc.structure_symmetry;
    row.space_group = sym.space_group_symbol + " (" + std::to_string(sym.space_group_number) + ")";
    row.bns_number = sym.bns_number;
    row.magnetic_type = sym.magnetic_type;
    const std::string key = group_key(*sc.structure, sym, !request.cuts.empty());
    std::optional<GroupAnswer> known = cache->find(key);
    if (!known) {
      auto counts_at = [&](const ScenarioResult& res, std::size_t step) {
        std::vector<int> counts;
        for (const auto& id : request.responses) {
          const std::string& id_key = ResponseCatalogue::builtin().get(id).id;
          int n = 0;
          for (const auto& part : res.parts)
            if (part.response_id == id_key) n = std::max(n, part.counts[step]);
          counts.push_back(n);
        }
        return counts;
      };
      GroupAnswer a;
      const ScenarioResult bulk = run_scenario(sc);
      const ChainStep& top = bulk.chain.front();
      a.point_group = top.id.type->symbol;
      a.setting = top.id.same_setting ? top.id.same_setting->symbol : "";
      a.counts.push_back(counts_at(bulk, 0));
      for (const auto& cut : request.cuts) {
        sc.cut = cut;
        const ScenarioResult film = run_scenario(sc);
        a.cut_groups.push_back(film.chain[1].id.type->symbol);
        a.counts.push_back(counts_at(film, 1));
      }
      cache->keep(key, a);
      known = a;
    }
    row.point_group = known->point_group;
    row.setting = known->setting;
    row.cut_groups = known->cut_groups;
    row.counts = known->counts;
  } catch (const Error& e) {
    row = ScreenRow{};
    row.file = file;
    row.error = (e.location().empty() ? "" : e.location() + ": ") + e.problem() +
                (e.valid().empty() ? "" : " (valid: " + e.valid() + ")");
  } catch (const std::exception& e) {
    row = ScreenRow{};
    row.file = file;
    row.error = std::string("internal error: ") + e.what();
  }
  return row;
}

} // namespace

std::vector<std::string> collect_structure_files(const std::vector<std::string>& paths) {
  std::vector<std::string> out;
  for (const auto& p : paths) {
    if (p.size() > 1 && p[0] == '@') {
      const fs::path list = p.substr(1);
      std::ifstream in(list);
      if (!in) fail(ErrorKind::bad_file, "cannot open the list file", list.string(), "a text file with one path per line");
      std::string line;
      int number = 0;
      while (std::getline(in, line)) {
        ++number;
        line = line.substr(0, line.find('#'));
        line.erase(0, line.find_first_not_of(" \t\r"));
        line.erase(line.find_last_not_of(" \t\r") + 1);
        if (line.empty()) continue;
        fs::path entry = line;
        if (entry.is_relative()) entry = list.parent_path() / entry;
        add_path(entry, list.string() + ":" + std::to_string(number), &out);
      }
    } else {
      add_path(p, "structure paths", &out);
    }
  }
  if (out.empty())
    fail(ErrorKind::bad_file, "no structure files found", "structure paths",
         "*.cif or *.mcif files, folders holding them, or @list.txt");
  return out;
}

std::vector<ScreenRow> screen_structures(const ScreenRequest& request, unsigned workers,
                                         const std::function<void(std::size_t, std::size_t)>& progress,
                                         const std::vector<ScreenRow>& already,
                                         const std::function<void(const ScreenRow&)>& finished) {
  if (request.responses.empty())
    fail(ErrorKind::usage, "no response to screen for", "--response",
         "one or more ids from `tensorsieve responses`, e.g. --response anomalous-hall");
  // Unknown ids are the user's mistake once, not a failure in every row; this
  // also loads both catalogues before the worker processes share their pages.
  for (const auto& id : request.responses) ResponseCatalogue::builtin().get(id);
  GroupCatalogue::builtin();

  const std::size_t total = request.files.size();
  std::vector<ScreenRow> rows(total);
  std::map<std::string, const ScreenRow*> known;
  for (const auto& r : already) known.emplace(r.file, &r);
  std::vector<std::size_t> todo;
  for (std::size_t i = 0; i < total; ++i) {
    auto it = known.find(request.files[i]);
    if (it != known.end()) rows[i] = *it->second;
    else todo.push_back(i);
  }
  if (workers == 0) workers = std::max(1u, std::thread::hardware_concurrency());
  std::size_t done = total - todo.size();
  GroupCache cache; // each worker process fills its own copy
  WorkerTasks tasks;
  // A worker is disposable, so it calls the symmetry library directly; a file
  // that ends its worker is screened again below, alone and with every library
  // call in a child process of its own, which names what went wrong.
  tasks.start = [] { set_symmetry_library_isolation(false); };
  tasks.work = [&](std::size_t i) { return journal_line(screen_one(request.files[i], request, &cache)); };
  tasks.lost = [&](std::size_t i, const std::string& why) {
    std::string answer;
    WorkerTasks alone;
    alone.work = tasks.work;
    alone.done = [&](std::size_t, const std::string& line) { answer = line; };
    alone.lost = [&](std::size_t, const std::string& again) {
      ScreenRow row;
      row.file = request.files[i];
      row.error = "screening this file ended its worker process (" + again +
                  "); the other files were screened. Please report it with the file";
      return journal_line(row);
    };
    (void)why; // the retry's own account replaces the first one
    run_in_worker_processes({i}, 1, alone);
    return answer;
  };
  tasks.done = [&](std::size_t i, const std::string& line) {
    if (!parse_journal_line(line, &rows[i]) || rows[i].file != request.files[i]) {
      rows[i] = ScreenRow{};
      rows[i].file = request.files[i];
      rows[i].error = "internal error: a worker process answered with an unreadable row";
    }
    ++done;
    if (finished) finished(rows[i]);
    if (progress) progress(done, total);
  };
  run_in_worker_processes(todo, workers, tasks);
  return rows;
}

} // namespace ts
