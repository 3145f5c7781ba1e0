/// \file hdf5_checked.cpp
/// \brief Reading HDF5 files from disk as input: every dataset's existence, rank, size
/// and type class is checked before a byte is read, and text has a size limit, so a
/// damaged or foreign file gives a clear error (exit 2) instead of a crash.
#include <fmt/format.h>

#include "io/run/hdf5_file.h"
#include "io/scene/diagnostics.h"

namespace ty::h5 {

void File::bad(const std::string& path, const std::string& what) const {
  throw BadInput(fmt::format("{}: error: {}: {}", name_, path, what));
}

std::vector<hsize_t> File::checked_shape(const std::string& path, int rank, hsize_t max_elements) const {
  if (!exists(path)) bad(path, "missing");
  Handle set(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), H5Dclose);
  if (!set) bad(path, "not a dataset");
  Handle space(H5Dget_space(set.id()), H5Sclose);
  const int r = space ? H5Sget_simple_extent_ndims(space.id()) : -1;
  if (r != rank) bad(path, fmt::format("has {} dimensions, expected {}", r, rank));
  std::vector<hsize_t> dims(static_cast<size_t>(rank));
  if (rank > 0) H5Sget_simple_extent_dims(space.id(), dims.data(), nullptr);
  hsize_t n = 1;
  for (hsize_t d : dims) {
    if (d != 0 && n > max_elements / d) bad(path, fmt::format("has more than {} values", max_elements));
    n *= d;
  }
  if (n > max_elements) bad(path, fmt::format("has more than {} values", max_elements));
  return dims;
}

std::vector<double> File::read_checked(const std::string& path, const std::vector<hsize_t>& expected) const {
  hsize_t n = 1;
  for (hsize_t d : expected) n *= d;
  if (expected.size() == 1) return read_checked_parts(path, n, {{0, n}});
  const std::vector<hsize_t> dims = checked_shape(path, static_cast<int>(expected.size()), n);
  if (dims != expected) {
    std::string got, want;
    for (size_t k = 0; k < dims.size(); ++k) got += (k ? " x " : "") + std::to_string(dims[k]);
    for (size_t k = 0; k < expected.size(); ++k) want += (k ? " x " : "") + std::to_string(expected[k]);
    bad(path, fmt::format("has shape [{}], expected [{}]", got, want));
  }
  Handle set(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), H5Dclose);
  Handle type(H5Dget_type(set.id()), H5Tclose);
  const H5T_class_t cls = type ? H5Tget_class(type.id()) : H5T_NO_CLASS;
  if (cls != H5T_FLOAT && cls != H5T_INTEGER) bad(path, "does not hold numbers");
  std::vector<double> out(n);
  if (n > 0 && H5Dread(set.id(), H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, out.data()) < 0)
    bad(path, "cannot be read");
  return out;
}

std::vector<double> File::read_checked_parts(const std::string& path, hsize_t n, const Parts& parts) const {
  const std::vector<hsize_t> dims = checked_shape(path, 1, n);
  if (dims[0] != n) bad(path, fmt::format("has shape [{}], expected [{}]", dims[0], n));
  Handle set(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), H5Dclose);
  Handle type(H5Dget_type(set.id()), H5Tclose);
  const H5T_class_t cls = type ? H5Tget_class(type.id()) : H5T_NO_CLASS;
  if (cls != H5T_FLOAT && cls != H5T_INTEGER) bad(path, "does not hold numbers");
  hsize_t total = 0;
  for (const auto& [a, b] : parts) total += b - a;
  std::vector<double> out(total);
  if (total == 0) return out;
  Handle file(H5Dget_space(set.id()), H5Sclose);
  bool first = true;
  for (const auto& [a, b] : parts) {
    if (b <= a) continue;
    const hsize_t start = a, count = b - a;
    H5Sselect_hyperslab(file.id(), first ? H5S_SELECT_SET : H5S_SELECT_OR, &start, nullptr, &count, nullptr);
    first = false;
  }
  Handle memory(H5Screate_simple(1, &total, nullptr), H5Sclose);
  if (H5Dread(set.id(), H5T_NATIVE_DOUBLE, memory.id(), file.id(), H5P_DEFAULT, out.data()) < 0)
    bad(path, "cannot be read");
  return out;
}

std::string File::read_text(const std::string& path, hsize_t max_bytes) const {
  const std::vector<hsize_t> dims = checked_shape(path, 1, max_bytes);
  Handle set(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), H5Dclose);
  Handle type(H5Dget_type(set.id()), H5Tclose);
  if (!type || H5Tget_class(type.id()) != H5T_INTEGER || H5Tget_size(type.id()) != 1) bad(path, "is not text");
  std::string s(dims[0], '\0');
  if (!s.empty() && H5Dread(set.id(), H5T_NATIVE_CHAR, H5S_ALL, H5S_ALL, H5P_DEFAULT, s.data()) < 0)
    bad(path, "cannot be read");
  return s;
}

/// A number or a string attribute of a file read back: a single number is read here; anything
/// else goes through read_string_attribute, whose checks (missing object or attribute, not a
/// single string) make it bad input (exit 2), as for the datasets.
std::string File::read_attribute(const std::string& object, const std::string& name) const {
  if ((object == "/" || exists(object)) && H5Aexists_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT) > 0) {
    Handle a(H5Aopen_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
    Handle type(a ? H5Aget_type(a.id()) : -1, H5Tclose);
    if (type && H5Tget_class(type.id()) == H5T_FLOAT) {
      const std::string where = object + " (attribute " + name + ")";
      Handle space(H5Aget_space(a.id()), H5Sclose);
      if (!space || H5Sget_simple_extent_npoints(space.id()) != 1) bad(where, "is not a single number");
      double v = 0;
      if (H5Aread(a.id(), H5T_NATIVE_DOUBLE, &v) < 0) bad(where, "cannot be read");
      return fmt::format("{}", v);
    }
  }
  return read_string_attribute(object, name, hsize_t(1) << 30);
}

std::string File::read_string_attribute(const std::string& object, const std::string& name, hsize_t max_bytes) const {
  const std::string where = object + " (attribute " + name + ")";
  if (!exists(object) && object != "/") bad(object, "missing");
  if (H5Aexists_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT) <= 0) bad(where, "missing");
  Handle a(H5Aopen_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT, H5P_DEFAULT), H5Aclose);
  Handle type(a ? H5Aget_type(a.id()) : -1, H5Tclose);
  Handle space(a ? H5Aget_space(a.id()) : -1, H5Sclose);
  if (!type || !space || H5Tget_class(type.id()) != H5T_STRING) bad(where, "is not a string");
  if (H5Sget_simple_extent_npoints(space.id()) != 1) bad(where, "is not a single string");
  if (H5Tis_variable_str(type.id()) > 0) {
    Handle mem(H5Tcopy(H5T_C_S1), H5Tclose);
    H5Tset_size(mem.id(), H5T_VARIABLE);
    char* p = nullptr;
    if (H5Aread(a.id(), mem.id(), &p) < 0 || !p) bad(where, "cannot be read");
    std::string s(p);
    H5free_memory(p);
    if (s.size() > max_bytes) bad(where, fmt::format("is longer than {} bytes", max_bytes));
    return s;
  }
  const size_t n = H5Tget_size(type.id());
  if (n > max_bytes) bad(where, fmt::format("is longer than {} bytes", max_bytes));
  std::string s(n, '\0');
  if (n > 0 && H5Aread(a.id(), type.id(), s.data()) < 0) bad(where, "cannot be read");
  while (!s.empty() && s.back() == '\0') s.pop_back();
  return s;
}

}  // namespace ty::h5
