// Shared by the libFuzzer targets: a parser must either succeed or throw ts::Error
// (a clean message and exit code in the CLI). Any other exception, a crash, a hang
// or a sanitizer report is a bug; libFuzzer saves the input that found it.
#pragma once

#include "core/error.hpp"

#include <cstddef>
#include <cstdint>
#include <string>

namespace ts::fuzz {

inline std::string text_of(const std::uint8_t* data, std::size_t size, std::size_t max = 4096) {
  return std::string(reinterpret_cast<const char*>(data), size < max ? size : max);
}

template <typename F>
int expect_clean(F parse) {
  try {
    parse();
  } catch (const ts::Error& e) {
    if (e.kind() == ts::ErrorKind::internal) __builtin_trap(); // an internal error is a bug
  }
  return 0;
}

} // namespace ts::fuzz
