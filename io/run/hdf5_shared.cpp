/// \file hdf5_shared.cpp
/// \brief Files that every rank of a run writes together (parallel HDF5 over MPI-IO, HDF5
/// User's Guide, "Parallel HDF5"): created with H5Pset_fapl_mpio on the run's ranks, each
/// dataset written by one collective H5Dwrite (H5Pset_dxpl_mpio, H5FD_MPIO_COLLECTIVE) in
/// which every rank selects the parts it owns, the same selection in its memory and in the
/// file (a union of hyperslabs). Creating datasets and attributes is collective metadata
/// work: every rank makes the same calls. This and solver/parallel/ranks.cpp are the only
/// files that name MPI (here only its world communicator, which MPI-IO needs).
/// Snapshot frames (run_folder.cpp) go through the same collective write, each rank
/// selecting the frame rows its grid rows hold (write_frame_rows).
/// On one rank, or in a build without MPI, the same calls write a plain file.
#include <fmt/format.h>

#include <stdexcept>

#include "io/run/hdf5_file.h"
#include "solver/parallel/ranks.h"

#if defined(TERAYEE_MPI) && !defined(H5_HAVE_PARALLEL)
#error "TERAYEE_MPI needs the MPI build of HDF5"
#endif

namespace ty::h5 {
namespace {

hid_t check(hid_t id, const std::string& what) {
  if (id < 0) throw std::runtime_error("HDF5: " + what);
  return id;
}

/// The access list of a file every rank opens together: MPI-IO over the run's ranks.
Handle shared_access(const std::string& path) {
  Handle fapl(check(H5Pcreate(H5P_FILE_ACCESS), "plist"), H5Pclose);
#ifdef TERAYEE_MPI
  check(H5Pset_fapl_mpio(fapl.id(), MPI_COMM_WORLD, MPI_INFO_NULL), "cannot use MPI-IO for " + path);
#else
  (void)path;
#endif
  return fapl;
}

}  // namespace

File File::create_shared(const std::string& path) {
  if (parallel::size() == 1) return create(path);
  File f;
  f.name_ = path;
  f.shared_ = true;
  Handle fapl = shared_access(path);
  H5Pset_libver_bounds(fapl.id(), H5F_LIBVER_V18, H5F_LIBVER_V18);  // the layout `create` writes
  f.h_ = Handle(check(H5Fcreate(path.c_str(), H5F_ACC_TRUNC, H5P_DEFAULT, fapl.id()), "cannot create " + path),
                H5Fclose);
  return f;
}

template <class T>
void File::parts_any(const std::string& path, hsize_t n, const T* data, const Parts& parts, hid_t type) {
  make_groups(path);
  const hsize_t dims[1] = {n};
  Handle space(check(H5Screate_simple(1, dims, nullptr), "dataspace"), H5Sclose);
  Handle set(check(H5Dcreate2(id(), path.c_str(), type, space.id(), H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT),
                   "cannot create " + path + " in " + name_),
             H5Dclose);
  if (n > 0) {  // n is the same on every rank: all write, or none
    Handle mem(check(H5Screate_simple(1, dims, nullptr), "dataspace"), H5Sclose);
    bool any = false;
    for (const auto& [a, b] : parts) {
      if (a >= b) continue;
      if (b > n) throw std::logic_error(fmt::format("write_parts: part [{}, {}) past the {} values of {}", a, b, n, path));
      const hsize_t start[1] = {a}, count[1] = {b - a};
      const H5S_seloper_t op = any ? H5S_SELECT_OR : H5S_SELECT_SET;
      check(H5Sselect_hyperslab(space.id(), op, start, nullptr, count, nullptr), "hyperslab");
      check(H5Sselect_hyperslab(mem.id(), op, start, nullptr, count, nullptr), "hyperslab");
      any = true;
    }
    if (!any) H5Sselect_none(space.id()), H5Sselect_none(mem.id());
    write_selected(set.id(), type, mem.id(), space.id(), data, path);
  }
  attribute(path, "units", "");
}

void File::write_selected(hid_t set, hid_t type, hid_t mem, hid_t space, const void* data, const std::string& path) {
  Handle xfer(check(H5Pcreate(H5P_DATASET_XFER), "plist"), H5Pclose);
#ifdef TERAYEE_MPI
  if (shared_) check(H5Pset_dxpl_mpio(xfer.id(), H5FD_MPIO_COLLECTIVE), "collective transfer");
#endif
  check(H5Dwrite(set, type, mem, space, xfer.id(), data), "cannot write " + path + " in " + name_);
}

File File::open_shared(const std::string& path) {
  if (parallel::size() == 1) return open_rw(path);
  File f;
  f.name_ = path;
  f.shared_ = true;
  Handle fapl = shared_access(path);
  f.h_ = Handle(check(H5Fopen(path.c_str(), H5F_ACC_RDWR, fapl.id()), "cannot open " + path), H5Fclose);
  return f;
}

/// The frame's rows [b0, b1): the same hyperslab in the frame's place in memory and in the
/// file's frame (every rank selects its own rows, or none, and all write together).
template <class T>
void File::frame_rows_any(const std::string& path, hsize_t frame, hsize_t b0, hsize_t b1, hsize_t ny, hsize_t nx,
                          const T* data, hid_t type) {
  if (b0 > b1 || b1 > ny)
    throw std::logic_error(fmt::format("write_frame_rows: rows [{}, {}) of {} in {}", b0, b1, ny, path));
  Handle set(check(H5Dopen2(id(), path.c_str(), H5P_DEFAULT), "cannot open " + path), H5Dclose);
  Handle space(check(H5Dget_space(set.id()), "dataspace"), H5Sclose);
  const hsize_t whole[2] = {ny, nx};
  Handle mem(check(H5Screate_simple(2, whole, nullptr), "dataspace"), H5Sclose);
  if (b1 > b0 && nx > 0) {
    const hsize_t fstart[3] = {frame, b0, 0}, fcount[3] = {1, b1 - b0, nx};
    const hsize_t mstart[2] = {b0, 0}, mcount[2] = {b1 - b0, nx};
    check(H5Sselect_hyperslab(space.id(), H5S_SELECT_SET, fstart, nullptr, fcount, nullptr), "hyperslab");
    check(H5Sselect_hyperslab(mem.id(), H5S_SELECT_SET, mstart, nullptr, mcount, nullptr), "hyperslab");
  } else {
    H5Sselect_none(space.id()), H5Sselect_none(mem.id());
  }
  write_selected(set.id(), type, mem.id(), space.id(), data, path);
}

void File::write_frame_rows(const std::string& p, hsize_t f, hsize_t b0, hsize_t b1, hsize_t ny, hsize_t nx,
                            const float* d) {
  frame_rows_any(p, f, b0, b1, ny, nx, d, H5T_NATIVE_FLOAT);
}
void File::write_frame_rows(const std::string& p, hsize_t f, hsize_t b0, hsize_t b1, hsize_t ny, hsize_t nx,
                            const double* d) {
  frame_rows_any(p, f, b0, b1, ny, nx, d, H5T_NATIVE_DOUBLE);
}

void File::write_parts(const std::string& p, hsize_t n, const double* d, const Parts& s) {
  parts_any(p, n, d, s, H5T_NATIVE_DOUBLE);
}
void File::write_parts(const std::string& p, hsize_t n, const float* d, const Parts& s) {
  parts_any(p, n, d, s, H5T_NATIVE_FLOAT);
}
void File::write_parts(const std::string& p, hsize_t n, const long* d, const Parts& s) {
  parts_any(p, n, d, s, H5T_NATIVE_LONG);
}
void File::write_parts(const std::string& p, hsize_t n, const char* d, const Parts& s) {
  parts_any(p, n, d, s, H5T_NATIVE_CHAR);
}

}  // namespace ty::h5
