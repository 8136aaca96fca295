// Tasks spread over worker processes (src/scenario/worker_processes.hpp):
// every task is answered once, a worker that crashes or aborts costs only its
// own task (reported through `lost`, with the signal named), and an exception
// from `done` stops the run and reaches the caller.
#include "scenario/worker_processes.hpp"

#include <catch2/catch.hpp>

#include <csignal>
#include <cstdlib>
#include <map>
#include <stdexcept>
#include <string>
#include <vector>

namespace {

std::vector<std::size_t> first_tasks(std::size_t n) {
  std::vector<std::size_t> v;
  for (std::size_t i = 0; i < n; ++i) v.push_back(i);
  return v;
}

} // namespace

TEST_CASE("every task is answered exactly once, whatever the number of workers") {
  for (unsigned workers : {1u, 2u, 5u}) {
    std::map<std::size_t, std::string> answers;
    std::size_t lost = 0;
    ts::WorkerTasks t;
    t.work = [](std::size_t i) { return std::string(i % 7 + 1, char('a' + i % 26)) + std::to_string(i * i); };
    t.done = [&](std::size_t i, const std::string& a) {
      CHECK(answers.count(i) == 0);
      answers[i] = a;
    };
    t.lost = [&](std::size_t, const std::string&) {
      ++lost;
      return std::string("lost");
    };
    ts::run_in_worker_processes(first_tasks(40), workers, t);
    REQUIRE(answers.size() == 40);
    CHECK(lost == 0);
    for (std::size_t i = 0; i < 40; ++i)
      CHECK(answers[i] == std::string(i % 7 + 1, char('a' + i % 26)) + std::to_string(i * i));
  }
}

TEST_CASE("an answer larger than a pipe buffer arrives whole") {
  std::string got;
  ts::WorkerTasks t;
  t.work = [](std::size_t) { return std::string(3 << 20, 'x') + "end"; };
  t.done = [&](std::size_t, const std::string& a) { got = a; };
  t.lost = [](std::size_t, const std::string& why) { return "lost: " + why; };
  ts::run_in_worker_processes({0}, 2, t);
  CHECK(got.size() == (3u << 20) + 3);
  CHECK(got.substr(got.size() - 3) == "end");
}

TEST_CASE("a worker that crashes or aborts costs only its own task, and says how it ended") {
  std::map<std::size_t, std::string> answers;
  std::map<std::size_t, std::string> lost_why;
  ts::WorkerTasks t;
  t.work = [](std::size_t i) -> std::string {
    // The test framework's own handlers would report the signal from inside the
    // worker; the default action is what a crash in a library meets.
    if (i == 3) {
      std::signal(SIGSEGV, SIG_DFL);
      std::raise(SIGSEGV);
    }
    if (i == 7) {
      std::signal(SIGABRT, SIG_DFL);
      std::abort();
    }
    if (i == 11) std::_Exit(3);
    return "ok " + std::to_string(i);
  };
  t.done = [&](std::size_t i, const std::string& a) { answers[i] = a; };
  t.lost = [&](std::size_t i, const std::string& why) {
    lost_why[i] = why;
    return std::string("error row");
  };
  ts::run_in_worker_processes(first_tasks(16), 2, t);
  REQUIRE(answers.size() == 16);
  REQUIRE(lost_why.size() == 3);
  CHECK(lost_why.count(3) == 1);
  CHECK(lost_why.count(7) == 1);
  CHECK(lost_why.count(11) == 1);
  CHECK(lost_why[3].find("11") != std::string::npos); // SIGSEGV
  CHECK(lost_why[7].find("6") != std::string::npos);  // SIGABRT
  CHECK(answers[3] == "error row");
  CHECK(answers[7] == "error row");
  for (std::size_t i : {0u, 1u, 2u, 4u, 5u, 6u, 8u, 9u, 10u, 12u, 13u, 14u, 15u})
    CHECK(answers[i] == "ok " + std::to_string(i));
}

TEST_CASE("an exception from done stops the run and reaches the caller") {
  std::size_t answered = 0;
  ts::WorkerTasks t;
  t.work = [](std::size_t i) { return std::to_string(i); };
  t.done = [&](std::size_t, const std::string&) {
    if (++answered == 5) throw std::runtime_error("disk full");
  };
  t.lost = [](std::size_t, const std::string&) { return std::string(); };
  CHECK_THROWS_WITH(ts::run_in_worker_processes(first_tasks(200), 2, t), "disk full");
  CHECK(answered == 5);
}

TEST_CASE("the start hook runs in each worker, not in the caller") {
  static int started_here = 0;
  ts::WorkerTasks t;
  t.start = [] { ++started_here; };
  std::vector<std::string> got;
  t.work = [](std::size_t) { return std::to_string(started_here); };
  t.done = [&](std::size_t, const std::string& a) { got.push_back(a); };
  t.lost = [](std::size_t, const std::string&) { return std::string(); };
  ts::run_in_worker_processes(first_tasks(6), 2, t);
  CHECK(started_here == 0);
  REQUIRE(got.size() == 6);
  for (const auto& a : got) CHECK(a == "1");
}
