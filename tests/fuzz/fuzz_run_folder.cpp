/// \file fuzz_run_folder.cpp
/// \brief libFuzzer target (LLVM libFuzzer, from Debian's clang) over the readers of a run
/// folder read back from disk: `render` (snapshots of fields.h5), `measure`'s readers
/// (probe traces, power-spectrum lines, spectral maps), `run --resume` (checkpoint.h5 and
/// fields.h5.partial) and summary.json. A real run folder of tests/fuzz/run/seed.yaml is
/// made once (a completed run, and one stopped with a checkpoint); each input is a list of
/// mutations of copies of its files, made through the HDF5 library so that the files stay
/// valid HDF5 and the search reaches our readers rather than the library's parser:
/// datasets removed, rewritten with another rank, shape, type or values (NaN, infinities,
/// huge, negative), declared huge without storage (a reader that reads before it checks
/// the size runs out of memory), attributes removed or changed; summary.json replaced by
/// the input's bytes. Every reader must end normally or in BadInput (exit 2 for the user);
/// any other exception, a crash, a hang or a sanitizer report is a finding. Built and run
/// by tools/fuzz.sh, outside the test suite.
#include <fuzzer/FuzzedDataProvider.h>
#include <hdf5.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <filesystem>
#include <fstream>
#include <limits>
#include <string>
#include <vector>

#include "io/analysis/power_spectrum_line.h"
#include "io/analysis/spectroscopy/probe_trace.h"
#include "io/run/spectral_map_file.h"
#include "io/scene/diagnostics.h"
#include "tools/commands.h"

namespace fs = std::filesystem;

namespace {

fs::path g_root;
std::vector<std::string> g_datasets[3];  // fields.h5 (complete), checkpoint.h5, fields.h5.partial (stopped)
const char* const kFiles[3] = {"complete/fields.h5", "stopped/checkpoint.h5", "stopped/fields.h5.partial"};

#if H5_VERSION_GE(1, 12, 0)
using ObjectInfo = H5O_info2_t;
#else
using ObjectInfo = H5O_info_t;
#endif

herr_t collect(hid_t, const char* name, const ObjectInfo* info, void* out) {
  if (info->type == H5O_TYPE_DATASET) static_cast<std::vector<std::string>*>(out)->push_back(std::string("/") + name);
  return 0;
}

std::vector<std::string> datasets_of(const fs::path& file) {
  std::vector<std::string> out;
  const hid_t f = H5Fopen(file.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT);
  if (f < 0) return out;
#if H5_VERSION_GE(1, 12, 0)
  H5Ovisit3(f, H5_INDEX_NAME, H5_ITER_NATIVE, collect, &out, H5O_INFO_BASIC);
#else
  H5Ovisit2(f, H5_INDEX_NAME, H5_ITER_NATIVE, collect, &out, H5O_INFO_BASIC);
#endif
  H5Fclose(f);
  return out;
}

ty::RunOptions options(const fs::path& out) {
  ty::RunOptions o;
  o.scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/fuzz/run/seed.yaml";
  o.out = out.string();
  o.quiet = true;
  o.checkpoint_minutes = 0;
  return o;
}

double special(FuzzedDataProvider& in) {
  static const double v[] = {0.0, -0.0, 1.0, -1.0, 1e-300, 1e300, -1e300, 1e-12, -1e8, 2147483648.0, 9.3e18,
                             std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::infinity(),
                             -std::numeric_limits<double>::infinity()};
  return in.ConsumeBool() ? v[in.ConsumeIntegralInRange<size_t>(0, std::size(v) - 1)] : in.ConsumeFloatingPoint<double>();
}

/// A new dataset at `path` in f: double, int or a fixed string; shape from the input.
void rewrite(hid_t f, const std::string& path, FuzzedDataProvider& in) {
  const int rank = in.ConsumeIntegralInRange(0, 3);
  hsize_t dims[3] = {1, 1, 1};
  hsize_t n = 1;
  for (int r = 0; r < rank; ++r) n *= (dims[r] = in.ConsumeIntegralInRange<hsize_t>(0, 9));
  const hid_t space = rank == 0 ? H5Screate(H5S_SCALAR) : H5Screate_simple(rank, dims, nullptr);
  const int kind = in.ConsumeIntegralInRange(0, 2);
  const hid_t type = kind == 0 ? H5T_NATIVE_DOUBLE : kind == 1 ? H5T_NATIVE_INT : H5Tcopy(H5T_C_S1);
  if (kind == 2) H5Tset_size(type, 8);
  const hid_t d = H5Dcreate2(f, path.c_str(), type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
  if (d >= 0) {
    if (kind == 0) {
      std::vector<double> v(n);
      for (auto& x : v) x = special(in);
      H5Dwrite(d, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, v.data());
    } else if (kind == 1) {
      std::vector<int> v(n);
      for (auto& x : v) x = in.ConsumeIntegral<int>();
      H5Dwrite(d, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, v.data());
    } else {
      std::string s = in.ConsumeBytesAsString(8 * n);
      s.resize(8 * n);
      H5Dwrite(d, type, H5S_ALL, H5S_ALL, H5P_DEFAULT, s.data());
    }
    H5Dclose(d);
  }
  if (kind == 2) H5Tclose(type);
  H5Sclose(space);
}

/// A dataset declared with up to 2^40 elements and no storage: reading it allocates.
void huge(hid_t f, const std::string& path, FuzzedDataProvider& in) {
  const int rank = in.ConsumeIntegralInRange(1, 3);
  hsize_t dims[3], chunk[3];
  for (int r = 0; r < rank; ++r) dims[r] = hsize_t(1) << in.ConsumeIntegralInRange(0, 40 / rank), chunk[r] = 1;
  const hid_t space = H5Screate_simple(rank, dims, nullptr);
  const hid_t plist = H5Pcreate(H5P_DATASET_CREATE);
  H5Pset_chunk(plist, rank, chunk);
  H5Pset_alloc_time(plist, H5D_ALLOC_TIME_LATE);
  const hid_t d = H5Dcreate2(f, path.c_str(), H5T_NATIVE_DOUBLE, space, H5P_DEFAULT, plist, H5P_DEFAULT);
  if (d >= 0) H5Dclose(d);
  H5Pclose(plist);
  H5Sclose(space);
}

/// New values in place, the shape kept.
void overwrite(hid_t f, const std::string& path, FuzzedDataProvider& in) {
  const hid_t d = H5Dopen2(f, path.c_str(), H5P_DEFAULT);
  if (d < 0) return;
  const hid_t space = H5Dget_space(d);
  const hssize_t n = H5Sget_simple_extent_npoints(space);
  if (n > 0 && n < 100000 && H5Tget_class(H5Dget_type(d)) == H5T_FLOAT) {
    std::vector<double> v(static_cast<size_t>(n));
    const double x = special(in);
    const size_t every = in.ConsumeIntegralInRange<size_t>(1, v.size());
    H5Dread(d, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, v.data());
    for (size_t k = in.ConsumeIntegralInRange<size_t>(0, v.size() - 1); k < v.size(); k += every) v[k] = x;
    H5Dwrite(d, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, v.data());
  }
  H5Sclose(space);
  H5Dclose(d);
}

/// An attribute of the dataset removed, or replaced by a string or a number.
void attribute(hid_t f, const std::string& path, FuzzedDataProvider& in) {
  static const char* names[] = {"units", "time-offset", "layout", "meaning", "positions", "convention"};
  const char* name = names[in.ConsumeIntegralInRange<size_t>(0, std::size(names) - 1)];
  if (H5Aexists_by_name(f, path.c_str(), name, H5P_DEFAULT) > 0) H5Adelete_by_name(f, path.c_str(), name, H5P_DEFAULT);
  if (in.ConsumeBool()) return;
  const hid_t space = H5Screate(H5S_SCALAR);
  if (in.ConsumeBool()) {
    const double v = special(in);
    const hid_t a = H5Acreate_by_name(f, path.c_str(), name, H5T_NATIVE_DOUBLE, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
    if (a >= 0) H5Awrite(a, H5T_NATIVE_DOUBLE, &v), H5Aclose(a);
  } else {
    const std::string s = in.ConsumeRandomLengthString(300);
    const hid_t type = H5Tcopy(H5T_C_S1);
    const bool variable = in.ConsumeBool();
    H5Tset_size(type, variable ? H5T_VARIABLE : std::max<size_t>(1, s.size()));
    const hid_t a = H5Acreate_by_name(f, path.c_str(), name, type, space, H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT);
    if (a >= 0) {
      const char* p = s.c_str();
      std::string padded = s;
      padded.resize(std::max<size_t>(1, s.size()));
      H5Awrite(a, type, variable ? static_cast<const void*>(&p) : padded.data());
      H5Aclose(a);
    }
    H5Tclose(type);
  }
  H5Sclose(space);
}

void mutate(const fs::path& work, FuzzedDataProvider& in) {
  const int ops = in.ConsumeIntegralInRange(1, 4);
  for (int op = 0; op < ops && in.remaining_bytes() > 0; ++op) {
    const int which = in.ConsumeIntegralInRange(0, 3);
    if (which == 3) {
      std::ofstream(work / "complete/summary.json") << in.ConsumeRandomLengthString(4096);
      continue;
    }
    const auto& list = g_datasets[which];
    if (list.empty()) continue;
    const std::string path = list[in.ConsumeIntegralInRange<size_t>(0, list.size() - 1)];
    const hid_t f = H5Fopen((work / kFiles[which]).c_str(), H5F_ACC_RDWR, H5P_DEFAULT);
    if (f < 0) continue;
    const int action = in.ConsumeIntegralInRange(0, 4);
    if (action <= 2 && H5Lexists(f, path.c_str(), H5P_DEFAULT) > 0) H5Ldelete(f, path.c_str(), H5P_DEFAULT);
    if (action == 1) rewrite(f, path, in);
    if (action == 2) huge(f, path, in);
    if (action == 3) overwrite(f, path, in);
    if (action == 4) attribute(f, path, in);
    H5Fclose(f);
  }
}

template <class F>
void expect_bad_input_at_most(const char* what, F&& f) {
  try {
    f();
  } catch (const ty::BadInput&) {
    // the user's exit 2
  } catch (const std::exception& e) {
    std::fprintf(stderr, "finding: %s ended in '%s' instead of BadInput\n", what, e.what());
    std::abort();
  }
}

void read_back(const fs::path& work) {
  const std::string run = (work / "complete").string();
  for (const char* field : {"Ez", "Hy", "Mx"})
    expect_bad_input_at_most("read_probe_trace", [&] {
      if (ty::has_probe_field(run, "p", field)) (void)ty::read_probe_trace(run, "p", field);
    });
  expect_bad_input_at_most("read_power_spectrum_line", [&] {
    if (!ty::has_power_spectrum_line(run, "line")) return;
    const auto a = ty::read_power_spectrum_line(run, "line");
    (void)ty::line_power(a, &a);
    (void)ty::power_spectrum_normal_axis(run);
  });
  expect_bad_input_at_most("SpectralMapFile", [&] {
    const ty::SpectralMapFile m(run, "map");
    const size_t k = m.frequency_index(0);
    for (const char* field : {"Ez", "Sx", "Sy"})
      if (m.has(field)) (void)m.field(field, k), (void)m.units(field);
    (void)m.intensity(k);
  });
  expect_bad_input_at_most("render (a still)", [&] {
    ty::RenderOptions o;
    o.run = run;
    o.time = 1e-12;
    o.size = 64;
    o.out = (work / "still.png").string();
    (void)ty::render_command(o);
  });
  expect_bad_input_at_most("render --map", [&] {
    ty::RenderOptions o;
    o.run = run;
    o.map = "map";
    o.size = 64;
    o.out = (work / "map.png").string();
    (void)ty::render_command(o);
  });
  expect_bad_input_at_most("run --resume", [&] {
    ty::RunOptions o = options(work / "stopped");
    o.resume = true;
    (void)ty::run_command(o);
  });
}

}  // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  g_root = fs::absolute("fuzz-runs");
  fs::remove_all(g_root);
  ty::RunOptions done = options(g_root / "seed/complete");
  ty::run_command(done);
  ty::RunOptions stopped = options(g_root / "seed/stopped");
  stopped.stop_at_step = 40;
  ty::run_command(stopped);
  for (int k = 0; k < 3; ++k) {
    g_datasets[k] = datasets_of(g_root / "seed" / kFiles[k]);
    std::fprintf(stderr, "fuzz_run_folder: %zu datasets in %s\n", g_datasets[k].size(), kFiles[k]);
  }
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  FuzzedDataProvider in(data, size);
  const fs::path work = g_root / "work";
  fs::remove_all(work);
  fs::create_directories(work);
  fs::copy(g_root / "seed", work, fs::copy_options::recursive);
  mutate(work, in);
  read_back(work);
  return 0;
}
