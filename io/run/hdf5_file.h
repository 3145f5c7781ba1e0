/// \file hdf5_file.h
/// \brief A small RAII wrapper over the HDF5 C API: files, groups (made on demand from
/// paths), whole datasets, frame-by-frame datasets, and string/number attributes.
#pragma once
#include <hdf5.h>

#include <string>
#include <utility>
#include <vector>

namespace ty::h5 {

/// Owns one HDF5 identifier and closes it with the matching H5*close.
class Handle {
 public:
  Handle() = default;
  Handle(hid_t id, herr_t (*close)(hid_t)) : id_(id), close_(close) {}
  Handle(const Handle&) = delete;
  Handle& operator=(const Handle&) = delete;
  Handle(Handle&& o) noexcept : id_(o.id_), close_(o.close_) { o.id_ = -1; }
  Handle& operator=(Handle&& o) noexcept;
  ~Handle();
  hid_t id() const { return id_; }
  explicit operator bool() const { return id_ >= 0; }

 private:
  hid_t id_ = -1;
  herr_t (*close_)(hid_t) = nullptr;
};

class File {
 public:
  static File create(const std::string& path);  ///< truncates
  static File open(const std::string& path);    ///< read-only
  static File open_rw(const std::string& path); ///< read-write, existing file
  /// A file every rank of the run writes together (hdf5_shared.cpp): over several MPI ranks
  /// it is created collectively through MPI-IO (H5Pset_fapl_mpio, HDF5 User's Guide,
  /// "Parallel HDF5"), and every call on it is collective (the same calls, with the same
  /// paths, shapes and attributes, on every rank); on one rank it is `create`.
  static File create_shared(const std::string& path);
  /// An existing file opened read-write by every rank together (MPI-IO, as create_shared);
  /// on one rank it is `open_rw`.
  static File open_shared(const std::string& path);
  void flush();
  hid_t id() const { return h_.id(); }

  /// Writes a whole dataset of the given shape (row-major), making parent groups.
  void write(const std::string& path, const std::vector<hsize_t>& shape, const double* data,
             const std::string& units);
  void write(const std::string& path, const std::vector<hsize_t>& shape, const float* data,
             const std::string& units);
  void write(const std::string& path, const std::vector<hsize_t>& shape, const int* data, const std::string& units);
  void write(const std::string& path, const std::vector<hsize_t>& shape, const long* data, const std::string& units);
  /// Parts [a, b) of a one-dimensional dataset of n values, as several ranks write it
  /// together (a file from create_shared): every rank calls it with the same path and n;
  /// this rank writes elements [a, b) of each of `parts` from `data`, its whole array
  /// (one collective write of a union of hyperslabs; no part may overlap another rank's).
  using Parts = std::vector<std::pair<std::size_t, std::size_t>>;
  void write_parts(const std::string& path, hsize_t n, const double* data, const Parts& parts);
  void write_parts(const std::string& path, hsize_t n, const float* data, const Parts& parts);
  void write_parts(const std::string& path, hsize_t n, const long* data, const Parts& parts);
  void write_parts(const std::string& path, hsize_t n, const char* data, const Parts& parts);
  /// A dataset [frames][ny][nx] written one frame at a time, chunked per frame.
  void create_frames(const std::string& path, hsize_t frames, hsize_t ny, hsize_t nx, bool single,
                     const std::string& units);
  /// Keeps the first `frames` frames of a frame series (a run that stopped by itself).
  void shrink_frames(const std::string& path, hsize_t frames);
  /// A [ny][nx] virtual dataset at `view` showing frame `frame` of the series `series` in
  /// this file (HDF5 >= 1.10, H5Pset_virtual; no data is copied). The file must have been
  /// opened without the 1.8 bounds of `create` (open_rw): the view's layout needs 1.10.
  void frame_view(const std::string& view, const std::string& series, hsize_t frame);
  /// Unlinks a dataset or group (its space is not reclaimed).
  void remove(const std::string& path);
  void write_frame(const std::string& path, hsize_t frame, hsize_t ny, hsize_t nx, const float* data);
  void write_frame(const std::string& path, hsize_t frame, hsize_t ny, hsize_t nx, const double* data);
  /// Rows [b0, b1) of frame `frame` of a [frames][ny][nx] series, as several ranks write it
  /// together (a file from create_shared or open_shared): every rank calls it for every
  /// frame, each with its own rows (possibly none), in one collective write; `data` holds the
  /// whole frame's place, [ny][nx], with this rank's rows filled.
  void write_frame_rows(const std::string& path, hsize_t frame, hsize_t b0, hsize_t b1, hsize_t ny, hsize_t nx,
                        const float* data);
  void write_frame_rows(const std::string& path, hsize_t frame, hsize_t b0, hsize_t b1, hsize_t ny, hsize_t nx,
                        const double* data);

  void attribute(const std::string& object, const std::string& name, const std::string& value);
  void attribute(const std::string& object, const std::string& name, double value);

  /// Reading back (tests and measurements).
  std::vector<double> read(const std::string& path, std::vector<hsize_t>* shape = nullptr) const;
  /// The names of a group's members, in name order.
  std::vector<std::string> members(const std::string& group) const;
  /// The dimensions of a dataset.
  std::vector<hsize_t> shape(const std::string& path) const;
  /// One frame [y][x] of a [frame][y][x] dataset (snapshots; a spectral map's frequency),
  /// converted to float or double, into `out` (resized).
  void read_frame(const std::string& path, hsize_t frame, std::vector<float>& out) const;
  void read_frame(const std::string& path, hsize_t frame, std::vector<double>& out) const;
  std::string read_attribute(const std::string& object, const std::string& name) const;
  bool exists(const std::string& path) const;
  const std::string& file_name() const { return name_; }

  /// Text of any length as a one-dimensional dataset of bytes (an attribute is limited
  /// to 64 KB in a default-format file, HDF5 User's Guide, "Attributes").
  void write_text(const std::string& path, const std::string& text);

  /// Checked readers for files from disk (hdf5_checked.cpp): each checks the dataset
  /// before reading it and throws BadInput ("FILE: error: DATASET: ...", exit 2).
  /// The shape of `path`, which must exist and have `rank` dimensions and at most
  /// `max_elements` values.
  std::vector<hsize_t> checked_shape(const std::string& path, int rank, hsize_t max_elements) const;
  /// A whole dataset of exactly the shape `expected`, as doubles.
  std::vector<double> read_checked(const std::string& path, const std::vector<hsize_t>& expected) const;
  /// Parts [a, b) (ascending, apart) of a one-dimensional dataset of exactly n values, one after
  /// another, as doubles: what one rank of several reads of a checkpoint (checkpoint.cpp).
  std::vector<double> read_checked_parts(const std::string& path, hsize_t n, const Parts& parts) const;
  /// A text dataset (write_text) of at most `max_bytes`.
  std::string read_text(const std::string& path, hsize_t max_bytes) const;
  /// A string attribute, fixed or variable length, of at most `max_bytes`.
  std::string read_string_attribute(const std::string& object, const std::string& name, hsize_t max_bytes) const;

 private:
  Handle h_;
  std::string name_;
  [[noreturn]] void bad(const std::string& path, const std::string& what) const;
  void make_groups(const std::string& path);
  template <class T>
  void write_any(const std::string& path, const std::vector<hsize_t>& shape, const T* data, hid_t type,
                 const std::string& units);
  template <class T>
  void parts_any(const std::string& path, hsize_t n, const T* data, const Parts& parts, hid_t type);
  bool shared_ = false;  ///< created by create_shared over several ranks: collective transfers
  template <class T>
  void frame_rows_any(const std::string& path, hsize_t frame, hsize_t b0, hsize_t b1, hsize_t ny, hsize_t nx,
                      const T* data, hid_t type);
  /// H5Dwrite of the selections, collective on a shared file (every rank calls it).
  void write_selected(hid_t set, hid_t type, hid_t mem, hid_t space, const void* data, const std::string& path);
  template <class T>
  void read_frame_any(const std::string& path, hsize_t frame, std::vector<T>& out, hid_t type) const;
  template <class T>
  void frame_any(const std::string& path, hsize_t frame, hsize_t ny, hsize_t nx, const T* data, hid_t type);
};

}  // namespace ty::h5
