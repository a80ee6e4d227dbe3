// Shared by the fuzz harnesses: run a reader on bytes given as text or as a temporary file, and accept
// only a result or a siiplan::Error (anything else -- a crash, another exception type -- is a finding).
#pragma once

#include <unistd.h>

#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include "astro/errors.hpp"

namespace siiplan::fuzz {

// Writes the bytes to a private temporary file with the given extension and returns its path.
inline std::filesystem::path bytes_to_file(const uint8_t* data, size_t size, const std::string& extension) {
  auto path = std::filesystem::temp_directory_path() /
              ("siiplan-fuzz-" + std::to_string(::getpid()) + extension);
  std::ofstream(path, std::ios::binary).write(reinterpret_cast<const char*>(data), std::streamsize(size));
  return path;
}

template <class F>
void expect_result_or_input_error(F&& f) {
  try {
    f();
  } catch (const siiplan::Error&) {
  }
}

}  // namespace siiplan::fuzz
