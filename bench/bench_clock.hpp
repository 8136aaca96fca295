// Timing helpers of the benchmark: a steady clock, medians over repeats, peak
// memory, and one fixed line layout so runs can be compared by diff.
#pragma once

#include <chrono>
#include <functional>
#include <string>
#include <vector>

namespace ts::bench {

using Clock = std::chrono::steady_clock;

// Seconds taken by one call of job.
double seconds_of(const std::function<void()>& job);

struct Timing {
  double first = 0;  // the first (cold) run: caches such as group generators still empty
  double median = 0; // median of all runs, the first included
  int runs = 0;
};
// Run job `repeats` times (at least once).
Timing time_repeated(int repeats, const std::function<void()>& job);

double median_of(std::vector<double> v);

// What became of a job run in a child process.
struct ProbeOutcome {
  enum Status { ok, failed, timed_out } status = failed;
  double median = 0;     // seconds, when ok
  int independent = -1;  // the job's result, when ok
  std::string message;   // why not, otherwise
};
// Run job `repeats` times in a forked child and report its median. A job that
// outlives `timeout` seconds is killed, so one runaway path cannot hide the
// figures after it. job returns the number of independent components.
ProbeOutcome run_in_child(int repeats, double timeout, const std::function<int()>& job);

// Wall time of one run of a program (argv[0] is its path) as a child process,
// standard output and error sent to /dev/null; the exit status goes to *status
// (-1 when it could not be started or did not exit normally).
// With `page_faults`, also the child's page faults (minor and major, wait4's rusage):
// on a virtual machine the first touch of a page costs microseconds, so they show
// where start-up time goes that instruction counts miss.
double seconds_of_process(const std::vector<std::string>& argv, int* status, long* page_faults = nullptr);

// Peak resident set size in MiB (getrusage ru_maxrss): of this process, and of
// the largest child that has been waited for.
double peak_memory_mib();
double peak_memory_children_mib();

// "12.34 ms", "567.8 us", "1.234 s": three or four significant figures.
std::string duration_text(double seconds);

// One figure per line: label, value, target, verdict, in fixed columns.
void print_figure(const std::string& label, const std::string& value, const std::string& target = "no target",
                  const std::string& verdict = "-");
void print_header();
// "met" or "MISSED", and counts it for the closing summary.
std::string verdict(bool met);
int targets_checked();
int targets_met();

} // namespace ts::bench
