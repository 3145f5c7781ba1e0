/// \file hdf5_file.cpp
/// \brief The HDF5 wrapper; every failure becomes a std::runtime_error naming the path.
#include "io/run/hdf5_file.h"

#include <fmt/format.h>

#include <algorithm>
#include <stdexcept>

namespace ty::h5 {
namespace {

hid_t check(hid_t id, const std::string& what) {
  if (id < 0) throw std::runtime_error("HDF5: " + what);
  return id;
}

struct Quiet {  // HDF5 prints its own error stack otherwise
  Quiet() {
    // Every file is closed by its Handle. A file whose close failed (a full disk) stays
    // in the library, and HDF5 1.10's exit-time cleanup crashes retrying it; without
    // that cleanup the process just ends and the system closes the descriptor.
    H5dont_atexit();
    H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  }
};
const Quiet quiet;

}  // namespace

Handle& Handle::operator=(Handle&& o) noexcept {
  std::swap(id_, o.id_);
  std::swap(close_, o.close_);
  return *this;
}

Handle::~Handle() {
  if (id_ >= 0 && close_) close_(id_);
}

File File::create(const std::string& path) {
  File f;
  f.name_ = path;
  // The 1.8 file format: attributes of any size (dense attribute storage, HDF5 User's
  // Guide, "Attributes"), and no open-for-writing flag that a killed run would leave set.
  Handle fapl(check(H5Pcreate(H5P_FILE_ACCESS), "plist"), H5Pclose);
  H5Pset_libver_bounds(fapl.id(), H5F_LIBVER_V18, H5F_LIBVER_V18);
  f.h_ = Handle(check(H5Fcreate(path.c_str(), H5F_ACC_TRUNC, H5P_DEFAULT, fapl.id()), "cannot create " + path),
                H5Fclose);
  return f;
}

File File::open(const std::string& path) {
  File f;
  f.name_ = path;
  f.h_ = Handle(check(H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), "cannot open " + path), H5Fclose);
  return f;
}

File File::open_rw(const std::string& path) {
  File f;
  f.name_ = path;
  f.h_ = Handle(check(H5Fopen(path.c_str(), H5F_ACC_RDWR, H5P_DEFAULT), "cannot open " + path), H5Fclose);
  return f;
}

void File::flush() { check(H5Fflush(id(), H5F_SCOPE_GLOBAL), "cannot write " + name_); }

bool File::exists(const std::string& path) const {
  size_t pos = 0;
  while ((pos = path.find('/', pos + 1)) != std::string::npos)
    if (H5Lexists(id(), path.substr(0, pos).c_str(), H5P_DEFAULT) <= 0) return false;
  return H5Lexists(id(), path.c_str(), H5P_DEFAULT) > 0;
}

void File::make_groups(const std::string& path) {
  size_t pos = 0;
  while ((pos = path.find('/', pos + 1)) != std::string::npos) {
    const std::string g = path.substr(0, pos);
    if (H5Lexists(id(), g.c_str(), H5P_DEFAULT) > 0) continue;
    Handle h(check(H5Gcreate2(id(), g.c_str(), H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT), "cannot make group " + g),
             H5Gclose);
  }
}

template <class T>
void File::write_any(const std::string& path, const std::vector<hsize_t>& shape, const T* data, hid_t type,
                     const std::string& units) {
  make_groups(path);
  Handle space(check(H5Screate_simple(static_cast<int>(shape.size()), shape.data(), nullptr), "dataspace"), H5Sclose);
  Handle set(check(H5Dcreate2(id(), path.c_str(), type, space.id(), H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT),
                   "cannot create " + path + " in " + name_),
             H5Dclose);
  check(H5Dwrite(set.id(), type, H5S_ALL, H5S_ALL, H5P_DEFAULT, data), "cannot write " + path + " in " + name_);
  attribute(path, "units", units);
}

void File::write(const std::string& p, const std::vector<hsize_t>& s, const double* d, const std::string& u) {
  write_any(p, s, d, H5T_NATIVE_DOUBLE, u);
}
void File::write(const std::string& p, const std::vector<hsize_t>& s, const float* d, const std::string& u) {
  write_any(p, s, d, H5T_NATIVE_FLOAT, u);
}
void File::write(const std::string& p, const std::vector<hsize_t>& s, const int* d, const std::string& u) {
  write_any(p, s, d, H5T_NATIVE_INT, u);
}

void File::write(const std::string& p, const std::vector<hsize_t>& s, const long* d, const std::string& u) {
  write_any(p, s, d, H5T_NATIVE_LONG, u);
}

void File::write_text(const std::string& path, const std::string& text) {
  const std::vector<hsize_t> shape{text.size()};
  write_any(path, shape, text.data(), H5T_NATIVE_CHAR, "");
}

void File::create_frames(const std::string& path, hsize_t frames, hsize_t ny, hsize_t nx, bool single,
                         const std::string& units) {
  make_groups(path);
  const hsize_t dims[3] = {frames, ny, nx};
  const hsize_t chunk[3] = {1, ny > 0 ? ny : 1, nx > 0 ? nx : 1};
  const bool chunked = frames > 0 && ny > 0 && nx > 0;
  const hsize_t most[3] = {H5S_UNLIMITED, ny, nx};  // chunked series may be cut short (shrink_frames)
  Handle space(check(H5Screate_simple(3, dims, chunked ? most : nullptr), "dataspace"), H5Sclose);
  Handle plist(check(H5Pcreate(H5P_DATASET_CREATE), "plist"), H5Pclose);
  if (chunked) H5Pset_chunk(plist.id(), 3, chunk);
  // Every chunk is placed now, so writing a frame later changes only raw data, never the
  // file's metadata: a run killed between two checkpoints leaves a file that still opens.
  // (Every frame is written before a run completes, so no fill value is needed.)
  H5Pset_alloc_time(plist.id(), H5D_ALLOC_TIME_EARLY);
  H5Pset_fill_time(plist.id(), H5D_FILL_TIME_NEVER);
  Handle set(check(H5Dcreate2(id(), path.c_str(), single ? H5T_NATIVE_FLOAT : H5T_NATIVE_DOUBLE, space.id(),
                              H5P_DEFAULT, plist.id(), H5P_DEFAULT),
                   "cannot create " + path + " in " + name_),
             H5Dclose);
  attribute(path, "units", units);
}

void File::shrink_frames(const std::string& path, hsize_t frames) {
  Handle set(check(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), "cannot open " + path), H5Dclose);
  Handle fs(check(H5Dget_space(set.id()), "dataspace"), H5Sclose);
  hsize_t dims[3];
  if (H5Sget_simple_extent_ndims(fs.id()) != 3) throw std::runtime_error(path + " is not a frame series");
  H5Sget_simple_extent_dims(fs.id(), dims, nullptr);
  if (frames >= dims[0]) return;
  dims[0] = frames;
  check(H5Dset_extent(set.id(), dims), "cannot shorten " + path);
}

void File::frame_view(const std::string& view, const std::string& series, hsize_t frame) {
  Handle set(check(H5Dopen2(id(), series.c_str(), H5P_DEFAULT), "cannot open " + series), H5Dclose);
  Handle src(check(H5Dget_space(set.id()), "dataspace"), H5Sclose);
  Handle type(check(H5Dget_type(set.id()), "type"), H5Tclose);
  hsize_t dims[3];
  if (H5Sget_simple_extent_ndims(src.id()) != 3) throw std::runtime_error(series + " is not a frame series");
  H5Sget_simple_extent_dims(src.id(), dims, nullptr);
  if (frame >= dims[0]) throw std::runtime_error(series + ": no frame " + std::to_string(frame));
  const hsize_t start[3] = {frame, 0, 0}, count[3] = {1, dims[1], dims[2]};
  check(H5Sselect_hyperslab(src.id(), H5S_SELECT_SET, start, nullptr, count, nullptr), "hyperslab");
  Handle vspace(check(H5Screate_simple(2, dims + 1, nullptr), "dataspace"), H5Sclose);
  Handle plist(check(H5Pcreate(H5P_DATASET_CREATE), "plist"), H5Pclose);
  // "." is this file itself (HDF5 reference manual, H5Pset_virtual).
  check(H5Pset_virtual(plist.id(), vspace.id(), ".", series.c_str(), src.id()), "cannot map " + view);
  make_groups(view);
  Handle v(check(H5Dcreate2(id(), view.c_str(), type.id(), vspace.id(), H5P_DEFAULT, plist.id(), H5P_DEFAULT),
                 "cannot create " + view + " in " + name_),
           H5Dclose);
}

void File::remove(const std::string& path) {
  check(H5Ldelete(id(), path.c_str(), H5P_DEFAULT), "cannot remove " + path);
}

template <class T>
void File::frame_any(const std::string& path, hsize_t frame, hsize_t ny, hsize_t nx, const T* data, hid_t type) {
  Handle set(check(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), "cannot open " + path), H5Dclose);
  Handle fs(check(H5Dget_space(set.id()), "dataspace"), H5Sclose);
  const hsize_t start[3] = {frame, 0, 0}, count[3] = {1, ny, nx};
  H5Sselect_hyperslab(fs.id(), H5S_SELECT_SET, start, nullptr, count, nullptr);
  Handle ms(check(H5Screate_simple(3, count, nullptr), "dataspace"), H5Sclose);
  check(H5Dwrite(set.id(), type, ms.id(), fs.id(), H5P_DEFAULT, data), "cannot write a frame of " + path + " in " + name_);
}

void File::write_frame(const std::string& p, hsize_t f, hsize_t ny, hsize_t nx, const float* d) {
  frame_any(p, f, ny, nx, d, H5T_NATIVE_FLOAT);
}
void File::write_frame(const std::string& p, hsize_t f, hsize_t ny, hsize_t nx, const double* d) {
  frame_any(p, f, ny, nx, d, H5T_NATIVE_DOUBLE);
}

void File::attribute(const std::string& object, const std::string& name, const std::string& value) {
  Handle type(check(H5Tcopy(H5T_C_S1), "string type"), H5Tclose);
  H5Tset_size(type.id(), value.empty() ? 1 : value.size());
  H5Tset_strpad(type.id(), H5T_STR_NULLTERM);
  Handle space(check(H5Screate(H5S_SCALAR), "dataspace"), H5Sclose);
  if (H5Aexists_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT) > 0)
    H5Adelete_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT);
  Handle a(check(H5Acreate_by_name(id(), object.c_str(), name.c_str(), type.id(), space.id(), H5P_DEFAULT,
                                   H5P_DEFAULT, H5P_DEFAULT),
                 "cannot add attribute " + name + " to " + object),
           H5Aclose);
  check(H5Awrite(a.id(), type.id(), value.c_str()), "cannot write attribute " + name);
}

void File::attribute(const std::string& object, const std::string& name, double value) {
  Handle space(check(H5Screate(H5S_SCALAR), "dataspace"), H5Sclose);
  if (H5Aexists_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT) > 0)
    H5Adelete_by_name(id(), object.c_str(), name.c_str(), H5P_DEFAULT);
  Handle a(check(H5Acreate_by_name(id(), object.c_str(), name.c_str(), H5T_NATIVE_DOUBLE, space.id(), H5P_DEFAULT,
                                   H5P_DEFAULT, H5P_DEFAULT),
                 "cannot add attribute " + name + " to " + object),
           H5Aclose);
  check(H5Awrite(a.id(), H5T_NATIVE_DOUBLE, &value), "cannot write attribute " + name);
}

std::vector<double> File::read(const std::string& path, std::vector<hsize_t>* shape) const {
  Handle set(check(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), "cannot open " + path), H5Dclose);
  Handle space(check(H5Dget_space(set.id()), "dataspace"), H5Sclose);
  const int rank = H5Sget_simple_extent_ndims(space.id());
  std::vector<hsize_t> dims(rank > 0 ? rank : 0);
  if (rank > 0) H5Sget_simple_extent_dims(space.id(), dims.data(), nullptr);
  hsize_t n = 1;
  for (auto d : dims) n *= d;
  std::vector<double> out(n);
  if (n > 0) check(H5Dread(set.id(), H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, out.data()), "cannot read " + path);
  if (shape) *shape = dims;
  return out;
}

std::vector<std::string> File::members(const std::string& group) const {
  Handle g(check(H5Gopen2(id(), group.c_str(), H5P_DEFAULT), "cannot open " + group), H5Gclose);
  H5G_info_t info;
  check(H5Gget_info(g.id(), &info), "group info");
  std::vector<std::string> out;
  for (hsize_t k = 0; k < info.nlinks; ++k) {
    const ssize_t n = H5Lget_name_by_idx(g.id(), ".", H5_INDEX_NAME, H5_ITER_INC, k, nullptr, 0, H5P_DEFAULT);
    std::string name(static_cast<size_t>(std::max<ssize_t>(n, 0)) + 1, '\0');
    H5Lget_name_by_idx(g.id(), ".", H5_INDEX_NAME, H5_ITER_INC, k, name.data(), name.size(), H5P_DEFAULT);
    name.resize(static_cast<size_t>(std::max<ssize_t>(n, 0)));
    out.push_back(name);
  }
  return out;
}

std::vector<hsize_t> File::shape(const std::string& path) const {
  Handle set(check(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), "cannot open " + path), H5Dclose);
  Handle space(check(H5Dget_space(set.id()), "dataspace"), H5Sclose);
  const int rank = H5Sget_simple_extent_ndims(space.id());
  std::vector<hsize_t> dims(rank > 0 ? rank : 0);
  if (rank > 0) H5Sget_simple_extent_dims(space.id(), dims.data(), nullptr);
  return dims;
}

template <class T>
void File::read_frame_any(const std::string& path, hsize_t frame, std::vector<T>& out, hid_t type) const {
  Handle set(check(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), "cannot open " + path), H5Dclose);
  Handle space(check(H5Dget_space(set.id()), "dataspace"), H5Sclose);
  hsize_t dims[3] = {0, 0, 0};
  if (H5Sget_simple_extent_ndims(space.id()) != 3) throw std::runtime_error(path + " is not [frame][y][x]");
  H5Sget_simple_extent_dims(space.id(), dims, nullptr);
  if (frame >= dims[0]) throw std::runtime_error(path + ": no such frame");
  const hsize_t start[3] = {frame, 0, 0}, count[3] = {1, dims[1], dims[2]};
  check(H5Sselect_hyperslab(space.id(), H5S_SELECT_SET, start, nullptr, count, nullptr), "hyperslab");
  Handle mem(check(H5Screate_simple(3, count, nullptr), "dataspace"), H5Sclose);
  out.resize(dims[1] * dims[2]);
  check(H5Dread(set.id(), type, mem.id(), space.id(), H5P_DEFAULT, out.data()), "cannot read " + path);
}

void File::read_frame(const std::string& path, hsize_t frame, std::vector<float>& out) const {
  read_frame_any(path, frame, out, H5T_NATIVE_FLOAT);
}

void File::read_frame(const std::string& path, hsize_t frame, std::vector<double>& out) const {
  read_frame_any(path, frame, out, H5T_NATIVE_DOUBLE);
}

}  // namespace ty::h5
