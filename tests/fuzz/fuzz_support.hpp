// Shared by the fuzz harnesses: run a reader on bytes given as text or as a temporary file, and accept
// only a result or a siiplan::InputError (anything else -- a crash, a RuntimeFailure (exit 1 for what is
// the input's fault), another exception type such as std::bad_alloc -- is a finding).
#pragma once

#include <unistd.h>

#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include "astro/errors.hpp"

namespace siiplan::fuzz {

inline std::string text(const uint8_t* data, size_t size) {
  return std::string(reinterpret_cast<const char*>(data), size);
}

// The bytes written to a private temporary file with the given extension (for readers that take a
// path: cfitsio, HDF5, the measurement CSV); removed again when the object goes out of scope.
class TempFile {
 public:
  TempFile(const uint8_t* data, size_t size, const std::string& extension)
      : path_(std::filesystem::temp_directory_path() / ("siiplan-fuzz-" + std::to_string(::getpid()) + extension)) {
    std::ofstream(path_, std::ios::binary | std::ios::trunc).write(reinterpret_cast<const char*>(data), std::streamsize(size));
  }
  ~TempFile() {
    std::error_code ec;
    std::filesystem::remove(path_, ec);
  }
  TempFile(const TempFile&) = delete;
  TempFile& operator=(const TempFile&) = delete;
  const std::filesystem::path& path() const { return path_; }

 private:
  std::filesystem::path path_;
};

template <class F>
void expect_result_or_input_error(F&& f) {
  try {
    f();
  } catch (const siiplan::InputError&) {
  }
}

}  // namespace siiplan::fuzz
