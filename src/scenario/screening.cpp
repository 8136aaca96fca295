#include "scenario/screening.hpp"

#include "core/error.hpp"
#include "group/group_catalogue.hpp"
#include "response/response_catalogue.hpp"
#include "scenario/scenario_run.hpp"

#include <algorithm>
#include <atomic>
#include <filesystem>
#include <fstream>
#include <mutex>
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

ScreenRow screen_one(const std::string& file, const ScreenRequest& request) {
  ScreenRow row;
  row.file = file;
  try {
    Scenario sc;
    sc.source = file;
    sc.structure = read_structure_file(file, request.options);
    sc.responses = request.responses;
    auto counts_at = [&](const ScenarioResult& res, std::size_t step) {
      std::vector<int> counts;
      for (const auto& id : request.responses) {
        const std::string& key = ResponseCatalogue::builtin().get(id).id;
        int n = 0;
        for (const auto& part : res.parts)
          if (part.response_id == key) n = std::max(n, part.counts[step]);
        counts.push_back(n);
      }
      return counts;
    };
    const ScenarioResult bulk = run_scenario(sc);
    const ChainStep& top = bulk.chain.front();
    row.point_group = top.id.type->symbol;
    row.setting = top.id.same_setting ? top.id.same_setting->symbol : "";
    if (bulk.structure_symmetry) {
      const StructureSymmetry& sym = *bulk.structure_symmetry;
      row.space_group = sym.space_group_symbol + " (" + std::to_string(sym.space_group_number) + ")";
      row.bns_number = sym.bns_number;
      row.magnetic_type = sym.magnetic_type;
    }
    row.counts.push_back(counts_at(bulk, 0));
    for (const auto& cut : request.cuts) {
      sc.cut = cut;
      const ScenarioResult film = run_scenario(sc);
      row.cut_groups.push_back(film.chain[1].id.type->symbol);
      row.counts.push_back(counts_at(film, 1));
    }
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

std::vector<ScreenRow> screen_structures(const ScreenRequest& request, unsigned threads,
                                         const std::function<void(std::size_t, std::size_t)>& progress) {
  if (request.responses.empty())
    fail(ErrorKind::usage, "no response to screen for", "--response",
         "one or more ids from `tensorsieve responses`, e.g. --response anomalous-hall");
  // Unknown ids are the user's mistake once, not a failure in every row; this
  // also loads both catalogues before the threads share them.
  for (const auto& id : request.responses) ResponseCatalogue::builtin().get(id);
  GroupCatalogue::builtin();

  const std::size_t total = request.files.size();
  std::vector<ScreenRow> rows(total);
  if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
  threads = static_cast<unsigned>(std::min<std::size_t>(threads, std::max<std::size_t>(total, 1)));
  std::atomic<std::size_t> next{0};
  std::size_t done = 0;
  std::mutex progress_mutex;
  auto work = [&] {
    for (std::size_t i = next++; i < total; i = next++) {
      rows[i] = screen_one(request.files[i], request);
      std::lock_guard<std::mutex> lock(progress_mutex);
      ++done;
      if (progress) progress(done, total);
    }
  };
  std::vector<std::thread> pool;
  for (unsigned t = 1; t < threads; ++t) pool.emplace_back(work);
  work();
  for (auto& t : pool) t.join();
  return rows;
}

} // namespace ts
