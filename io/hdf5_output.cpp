#include "io/hdf5_output.hpp"

#include <ostream>
#include <vector>

#include "astro/errors.hpp"
#include "io/atomic_file.hpp"

namespace siiplan::io {

namespace {
[[noreturn]] void fail(const std::filesystem::path& target, const std::string& what) {
  throw RuntimeFailure(target.string(), "HDF5 could not " + what, "check free memory; nothing was written");
}
}  // namespace

Hdf5MemoryFile::Hdf5MemoryFile(std::filesystem::path target) : target_(std::move(target)) {
  const hid_t fcpl = H5Pcreate(H5P_FILE_CREATE), fapl = H5Pcreate(H5P_FILE_ACCESS);
  gcpl_ = H5Pcreate(H5P_GROUP_CREATE);
  dcpl_ = H5Pcreate(H5P_DATASET_CREATE);
  bool ok = fcpl >= 0 && fapl >= 0 && gcpl_ >= 0 && dcpl_ >= 0 && H5Pset_obj_track_times(fcpl, false) >= 0 &&
            H5Pset_obj_track_times(gcpl_, false) >= 0 && H5Pset_obj_track_times(dcpl_, false) >= 0 &&
            H5Pset_fapl_core(fapl, 1 << 20, /*backing_store=*/false) >= 0;
  if (ok) file_ = H5Fcreate(target_.string().c_str(), H5F_ACC_TRUNC, fcpl, fapl);
  if (fcpl >= 0) H5Pclose(fcpl);
  if (fapl >= 0) H5Pclose(fapl);
  if (file_ < 0) {
    if (gcpl_ >= 0) H5Pclose(gcpl_);
    if (dcpl_ >= 0) H5Pclose(dcpl_);
    fail(target_, "create the file in memory");
  }
}

Hdf5MemoryFile::~Hdf5MemoryFile() {
  H5Pclose(gcpl_);
  H5Pclose(dcpl_);
  H5Fclose(file_);
}

void Hdf5MemoryFile::commit() {
  if (H5Fflush(file_, H5F_SCOPE_GLOBAL) < 0) fail(target_, "flush the file");
  const ssize_t size = H5Fget_file_image(file_, nullptr, 0);
  if (size < 0) fail(target_, "take the file image");
  std::vector<char> image(static_cast<std::size_t>(size));
  if (H5Fget_file_image(file_, image.data(), image.size()) != size) fail(target_, "take the file image");
  write_text_atomically(target_, [&](std::ostream& out) { out.write(image.data(), std::streamsize(image.size())); });
}

}  // namespace siiplan::io
