#include "io/atomic_file.hpp"

#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <iostream>
#include <random>

#include "astro/errors.hpp"

namespace siiplan::io {

namespace fs = std::filesystem;

namespace {
std::string unique_suffix() {
  std::random_device rd;
  return ".tmp-" + std::to_string(::getpid()) + "-" + std::to_string(rd() % 1000000);
}
}  // namespace

AtomicPath::AtomicPath(fs::path target) : target_(std::move(target)) {
  fs::path dir = target_.has_parent_path() ? target_.parent_path() : fs::path(".");
  std::error_code ec;
  if (!fs::is_directory(dir, ec))
    throw RuntimeFailure(target_.string(), "the output directory '" + dir.string() + "' does not exist",
                         "create it first or choose another output path");
  std::string name = ".";
  name.append(target_.filename().string()).append(unique_suffix());
  temp_ = dir / name;
}

AtomicPath::~AtomicPath() {
  if (!committed_) {
    std::error_code ec;
    fs::remove(temp_, ec);
  }
}

void AtomicPath::commit() {
  std::error_code ec;
  fs::rename(temp_, target_, ec);
  if (ec)
    throw RuntimeFailure(target_.string(), "cannot move the finished output into place: " + ec.message(),
                         "check the directory's permissions and free space");
  committed_ = true;
}

void write_text_atomically(const fs::path& target, const std::function<void(std::ostream&)>& fill) {
  AtomicPath path(target);
  {
    std::ofstream out(path.temp(), std::ios::binary | std::ios::trunc);
    if (!out)
      throw RuntimeFailure(target.string(), std::string("cannot create the output file: ") + std::strerror(errno),
                           "check that the directory is writable");
    fill(out);
    out.flush();
    if (!out)
      throw RuntimeFailure(target.string(), "writing the output failed (disk full?)",
                           "free some space or write elsewhere; nothing was changed");
  }
  path.commit();
}

void write_text_output(const std::string& target, const std::function<void(std::ostream&)>& fill) {
  if (target.empty() || target == "-") {
    fill(std::cout);
    std::cout.flush();
    if (!std::cout) throw RuntimeFailure("standard output", "writing failed", "check the pipe or terminal");
    return;
  }
  write_text_atomically(target, fill);
}

}  // namespace siiplan::io
