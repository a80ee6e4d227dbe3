// Small building blocks shared by siiplan's HDF5 files (plan.h5, correlation files): an RAII holder for
// HDF5 identifiers, the UTF-8 variable-length string type, a guard that silences HDF5's own error printing
// (its failures become our exceptions), and a writer whose every failure is a RuntimeFailure naming the
// object. Readers stay with their files: their messages say what kind of file was expected.
#pragma once

#include <hdf5.h>

#include <string>
#include <vector>

#include "astro/errors.hpp"

namespace siiplan::io::hdf5 {

// One HDF5 identifier, closed on scope exit with its matching close function.
class Id {
 public:
  Id(hid_t id, herr_t (*close)(hid_t)) : id_(id), close_(close) {}
  ~Id() {
    if (id_ >= 0) close_(id_);
  }
  Id(const Id&) = delete;
  Id& operator=(const Id&) = delete;
  operator hid_t() const { return id_; }
  bool ok() const { return id_ >= 0; }

 private:
  hid_t id_;
  herr_t (*close_)(hid_t);
};

// Variable-length UTF-8 string type (close with H5Tclose).
inline hid_t text_type() {
  hid_t t = H5Tcopy(H5T_C_S1);
  H5Tset_size(t, H5T_VARIABLE);
  H5Tset_cset(t, H5T_CSET_UTF8);
  return t;
}

// Silences HDF5's error stack printing for its lifetime.
struct Quiet {
  H5E_auto2_t func = nullptr;
  void* data = nullptr;
  Quiet() {
    H5Eget_auto2(H5E_DEFAULT, &func, &data);
    H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  }
  ~Quiet() { H5Eset_auto2(H5E_DEFAULT, func, data); }
  Quiet(const Quiet&) = delete;
  Quiet& operator=(const Quiet&) = delete;
};

// Whether `n_values` values of `value_bytes` bytes each can be stored in the file that holds `obj`.
// Readers ask before they allocate, so that a damaged header cannot make them ask for gigabytes.
// siiplan's writers store every value (nothing is read back as an unwritten fill value); a foreign file
// may deflate its data, and zlib's best ratio is 1032:1 (zlib technical details, "maximum compression
// factor"), so more bytes than 1032 times the file's size cannot be there.
inline bool fits_in_file(hid_t obj, hsize_t n_values, std::size_t value_bytes) {
  constexpr hsize_t kMaxCompression = 1032;
  Id file(H5Iget_file_id(obj), H5Fclose);
  hsize_t file_bytes = 0;
  if (!file.ok() || H5Fget_filesize(file, &file_bytes) < 0) return false;
  return value_bytes == 0 || n_values <= file_bytes * kMaxCompression / value_bytes;
}

// Writing: every failure is a RuntimeFailure naming the file and the object.
struct Writer {
  std::string file;
  hid_t gcpl = H5P_DEFAULT, dcpl = H5P_DEFAULT;   // creation properties (no modification times)

  void check(bool ok, const std::string& what) const {
    if (!ok) throw RuntimeFailure(file, "HDF5 could not write " + what, "check free disk space and permissions");
  }
  hid_t group(hid_t parent, const char* name) const {
    hid_t g = H5Gcreate2(parent, name, H5P_DEFAULT, gcpl, H5P_DEFAULT);
    check(g >= 0, name);
    return g;
  }
  void attr(hid_t obj, const char* name, const double* values, hsize_t n) const {
    Id space(n == 1 ? H5Screate(H5S_SCALAR) : H5Screate_simple(1, &n, nullptr), H5Sclose);
    Id a(H5Acreate2(obj, name, H5T_NATIVE_DOUBLE, space, H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
    check(a.ok() && H5Awrite(a, H5T_NATIVE_DOUBLE, values) >= 0, name);
  }
  void attr(hid_t obj, const char* name, double v) const { attr(obj, name, &v, 1); }
  void attr_int(hid_t obj, const char* name, int v) const {
    Id space(H5Screate(H5S_SCALAR), H5Sclose);
    Id a(H5Acreate2(obj, name, H5T_NATIVE_INT, space, H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
    check(a.ok() && H5Awrite(a, H5T_NATIVE_INT, &v) >= 0, name);
  }
  void attr_text(hid_t obj, const char* name, const std::string& v) const {
    Id type(text_type(), H5Tclose);
    Id space(H5Screate(H5S_SCALAR), H5Sclose);
    Id a(H5Acreate2(obj, name, type, space, H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
    const char* p = v.c_str();
    check(a.ok() && H5Awrite(a, type, &p) >= 0, name);
  }
  // A dataset of the given shape; file_type is how it is stored, mem_type what `values` points to.
  void data(hid_t parent, const char* name, hid_t file_type, hid_t mem_type, const void* values,
            const std::vector<hsize_t>& dims) const {
    Id space(H5Screate_simple(int(dims.size()), dims.data(), nullptr), H5Sclose);
    Id d(H5Dcreate2(parent, name, file_type, space, H5P_DEFAULT, dcpl, H5P_DEFAULT), H5Dclose);
    bool empty = false;
    for (auto n : dims) empty = empty || n == 0;
    check(d.ok() && (empty || H5Dwrite(d, mem_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, values) >= 0), name);
  }
  void doubles(hid_t parent, const char* name, const std::vector<double>& v, std::vector<hsize_t> dims = {}) const {
    if (dims.empty()) dims = {v.size()};
    data(parent, name, H5T_NATIVE_DOUBLE, H5T_NATIVE_DOUBLE, v.data(), dims);
  }
  void ints(hid_t parent, const char* name, const std::vector<int>& v, std::vector<hsize_t> dims = {}) const {
    if (dims.empty()) dims = {v.size()};
    data(parent, name, H5T_NATIVE_INT, H5T_NATIVE_INT, v.data(), dims);
  }
  void texts(hid_t parent, const char* name, const std::vector<std::string>& v) const {
    std::vector<const char*> p;
    for (const auto& s : v) p.push_back(s.c_str());
    Id type(text_type(), H5Tclose);
    data(parent, name, type, type, p.data(), {v.size()});
  }
};

}  // namespace siiplan::io::hdf5
