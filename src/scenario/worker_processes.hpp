// Independent tasks spread over worker processes rather than threads.
//
// Screening a folder is a set of independent files whose work is mostly the
// symmetry library's. Threads of one process share its address space, so the
// child process each library call needs (to survive a crash there) is forked
// from a big, busy process and the threads queue on its memory map: two threads
// gave about 1.4 times the rate of one. Workers forked once, at the start, from
// a process that has already loaded its catalogues share those pages copy-on-
// write and nothing else, so they scale with the cores. A worker that dies
// (a crash in a library, a signal) costs its one task, which the caller turns
// into an error; a fresh worker takes its place.
#pragma once

#include <cstddef>
#include <functional>
#include <string>
#include <vector>

namespace ts {

struct WorkerTasks {
  // Runs once in each worker process as it starts (optional).
  std::function<void()> start;
  // Runs in a worker: the answer to task i as bytes (it must not throw; an
  // exception ends the worker like a crash).
  std::function<std::string(std::size_t)> work;
  // Runs in the calling process, one call at a time, as each answer arrives
  // (in the order tasks finish).
  std::function<void(std::size_t, const std::string&)> done;
  // Runs in the calling process when the worker on task i died: `why` says
  // how ("signal 11, Segmentation fault"); the returned bytes stand for the answer.
  std::function<std::string(std::size_t, const std::string& why)> lost;
};

// Runs every task of `tasks` (indices passed to work) on up to `workers`
// processes (at least one). When no process can be started, the tasks run in
// this process, one after another, and the work's own protections apply.
// An exception from `done` stops the run (the workers are ended) and is rethrown.
void run_in_worker_processes(const std::vector<std::size_t>& tasks, unsigned workers, const WorkerTasks& t);

} // namespace ts
