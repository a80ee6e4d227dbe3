// Output files that appear whole or not at all.
//
// Every output is written to a temporary file in the same directory (so the final rename stays on one
// file system) and renamed over the target only after the content is complete and flushed. If the
// writer throws, or the process dies, the target is untouched (the old file or none), never partial.
#pragma once

#include <filesystem>
#include <fstream>
#include <functional>
#include <iosfwd>
#include <string>

namespace siiplan::io {

// A temporary path beside `target` for libraries that want a file name (cfitsio, HDF5).
// commit() renames it onto the target; the destructor removes it if commit() was not reached.
class AtomicPath {
 public:
  explicit AtomicPath(std::filesystem::path target);
  ~AtomicPath();
  AtomicPath(const AtomicPath&) = delete;
  AtomicPath& operator=(const AtomicPath&) = delete;
  const std::filesystem::path& temp() const { return temp_; }
  const std::filesystem::path& target() const { return target_; }
  void commit();   // throws RuntimeFailure when the rename fails
 private:
  std::filesystem::path target_, temp_;
  bool committed_ = false;
};

// Write a text file atomically: `fill` writes the content to the stream. Stream failures (disk full,
// unwritable directory) become RuntimeFailure naming the file.
void write_text_atomically(const std::filesystem::path& target, const std::function<void(std::ostream&)>& fill);

// Write to `target`, or to standard output when target is empty or "-".
void write_text_output(const std::string& target, const std::function<void(std::ostream&)>& fill);

}  // namespace siiplan::io
