#include "bench_clock.hpp"

#include <sys/resource.h>

#include <algorithm>
#include <cstdio>

namespace ts::bench {

namespace {
int checked = 0, met = 0;
constexpr int label_width = 68, value_width = 14, target_width = 16;
} // namespace

double seconds_of(const std::function<void()>& job) {
  auto t0 = Clock::now();
  job();
  auto t1 = Clock::now();
  return std::chrono::duration<double>(t1 - t0).count();
}

double median_of(std::vector<double> v) {
  if (v.empty()) return 0;
  std::sort(v.begin(), v.end());
  std::size_t n = v.size();
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

Timing time_repeated(int repeats, const std::function<void()>& job) {
  std::vector<double> t;
  for (int i = 0; i < std::max(1, repeats); ++i) t.push_back(seconds_of(job));
  return {t.front(), median_of(t), static_cast<int>(t.size())};
}

double peak_memory_mib() {
  rusage u{};
  getrusage(RUSAGE_SELF, &u);
  return static_cast<double>(u.ru_maxrss) / 1024.0; // Linux reports KiB
}

std::string duration_text(double s) {
  char buf[64];
  if (s >= 1.0) std::snprintf(buf, sizeof buf, "%.3f s", s);
  else if (s >= 1e-3) std::snprintf(buf, sizeof buf, "%.2f ms", s * 1e3);
  else std::snprintf(buf, sizeof buf, "%.1f us", s * 1e6);
  return buf;
}

void print_header() {
  std::printf("%-*s %*s   %-*s %s\n", label_width, "figure", value_width, "value", target_width, "target",
              "verdict");
  std::printf("%s\n", std::string(label_width + value_width + target_width + 13, '-').c_str());
}

void print_figure(const std::string& label, const std::string& value, const std::string& target,
                  const std::string& verdict_text) {
  std::printf("%-*s %*s   %-*s %s\n", label_width, label.c_str(), value_width, value.c_str(), target_width,
              target.c_str(), verdict_text.c_str());
  std::fflush(stdout);
}

std::string verdict(bool ok) {
  ++checked;
  if (ok) ++met;
  return ok ? "met" : "MISSED";
}

int targets_checked() { return checked; }
int targets_met() { return met; }

} // namespace ts::bench
