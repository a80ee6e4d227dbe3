// HDF5 output files that appear whole or not at all, and are reproducible byte for byte.
//
// The file is assembled in memory (HDF5 core driver without a backing store) and, when complete, its
// image is written to the target through write_text_atomically (io/atomic_file.hpp). So a full disk,
// an unwritable directory or a kill leaves the old file or none, and HDF5 never holds a half-written
// file open (with a file on a full disk, HDF5 1.10 crashed at exit trying to close it again).
// Objects are created without modification times (H5Pset_obj_track_times false): the same content
// gives the same bytes (DEVELOPERS.md, "Determinism").
#pragma once

#include <hdf5.h>

#include <filesystem>
#include <string>

namespace siiplan::io {

class Hdf5MemoryFile {
 public:
  explicit Hdf5MemoryFile(std::filesystem::path target);   // RuntimeFailure when HDF5 fails
  ~Hdf5MemoryFile();
  Hdf5MemoryFile(const Hdf5MemoryFile&) = delete;
  Hdf5MemoryFile& operator=(const Hdf5MemoryFile&) = delete;
  hid_t id() const { return file_; }
  // Creation property lists to pass to H5Gcreate2 / H5Dcreate2 (no modification times).
  hid_t group_properties() const { return gcpl_; }
  hid_t dataset_properties() const { return dcpl_; }
  // Flushes the file, takes its image and writes it atomically to the target; RuntimeFailure naming
  // the target when HDF5 or the disk fails.
  void commit();

 private:
  std::filesystem::path target_;
  hid_t file_ = -1, gcpl_ = -1, dcpl_ = -1;
};

}  // namespace siiplan::io
