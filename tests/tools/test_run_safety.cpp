/// \file test_run_safety.cpp
/// \brief No lost work (issues #12, #13), end to end with the `terayee` program: a run
/// folder that is not empty is refused without --resume or --overwrite; a stop that
/// was asked for exits 0 and a signal 128 + its number (the shell's convention, POSIX
/// Shell Command Language 2.8.2), each after writing its checkpoint; a failed resume keeps
/// the checkpoint; kill -9 at a fixed step, inside a checkpoint write, before and after
/// the final rename, each followed by --resume, ends with the bits of a straight run; a
/// scene above 64 KB checkpoints, and so does a run whose snapshots fall after its end; a movie named "-x.mp4" is a file, not an ffmpeg option.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <array>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>

#include "io/pictures/movie_writer.h"
#include "io/run/hdf5_file.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {

const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/window-beam.yaml";
const std::string kSets = " --threads 2 --set time.stop=10ps --set outputs.0.snapshots.every=2ps";

/// Runs `terayee run` with extra arguments; the exit status (128 + n for a death by signal
/// n, as a shell reports it), and stdout + stderr in `out`.
int terayee_run(const fs::path& dir, const std::string& args, std::string& out, const std::string& env = "") {
  const std::string cmd = env + " " + std::string(TERAYEE_BINARY) + " run '" + kScene + "' -o '" + dir.string() + "'" +
                          kSets + args + " 2>&1";
  FILE* p = popen(cmd.c_str(), "r");
  REQUIRE(p);
  out.clear();
  std::array<char, 4096> buf;
  while (size_t n = fread(buf.data(), 1, buf.size(), p)) out.append(buf.data(), n);
  const int status = pclose(p);
  if (WIFSIGNALED(status)) return 128 + WTERMSIG(status);
  return WEXITSTATUS(status);  // sh itself reports a killed child as 128 + n
}

int terayee_run(const fs::path& dir, const std::string& args, const std::string& env = "") {
  std::string out;
  return terayee_run(dir, args, out, env);
}

fs::path fresh(const std::string& name) {
  const fs::path dir = fs::temp_directory_path() / name;
  fs::remove_all(dir);
  return dir;
}

void same_bits(const fs::path& a, const fs::path& b) {
  const auto fa = h5::File::open((a / "fields.h5").string()), fb = h5::File::open((b / "fields.h5").string());
  for (const char* d : {"/snapshots/Ez", "/snapshots/Hx", "/snapshots/Hy", "/snapshots/time",
                        "/probes/behind-window/Ez", "/probes/behind-window/Sx", "/grid/medium"}) {
    INFO(d);
    const auto x = fa.read(d), y = fb.read(d);
    REQUIRE(x.size() == y.size());
    CHECK(std::memcmp(x.data(), y.data(), x.size() * sizeof(double)) == 0);
  }
}

}  // namespace

TEST_CASE("a run folder that is not empty is refused unless --resume or --overwrite says what to do") {
  const fs::path dir = fresh("terayee-test-overwrite");
  REQUIRE(terayee_run(dir, "") == 0);
  std::ofstream(dir / "notes.txt") << "mine";
  std::string out;
  CHECK(terayee_run(dir, "", out) == 2);
  CHECK(out.find("not empty") != std::string::npos);
  CHECK(out.find("--overwrite") != std::string::npos);
  CHECK(fs::exists(dir / "fields.h5"));  // the earlier results are untouched
  CHECK(terayee_run(dir, " --resume --overwrite") == 2);
  CHECK(terayee_run(dir, " --overwrite") == 0);
  CHECK(fs::exists(dir / "notes.txt"));       // only the files a run writes are replaced
  CHECK(terayee_run(dir, " --resume") == 0);  // a completed run: nothing to do
  // but a completed run of other settings is not the run asked for (a script resuming a
  // long setting in a folder that holds a short run would take its results for the long one)
  CHECK(terayee_run(dir, " --set time.stop=11ps --resume", out) == 2);
  CHECK(out.find("completed run of another scene") != std::string::npos);
  CHECK(fs::exists(dir / "summary.json"));  // left as it was
  fs::remove_all(dir);
}

TEST_CASE("stops write a checkpoint (asked for: exit 0, by a signal: 128 + signal) and a failed resume keeps it") {
  const fs::path dir = fresh("terayee-test-stops");
  CHECK(terayee_run(dir, " --stop-at-step 40") == 0);
  CHECK(fs::exists(dir / "checkpoint.h5"));
  CHECK_FALSE(fs::exists(dir / "fields.h5"));
  // another scene: refused, and the checkpoint and its partial results stay
  CHECK(terayee_run(dir, " --set time.stop=11ps --resume") == 2);
  CHECK(fs::exists(dir / "checkpoint.h5"));
  CHECK(fs::exists(dir / "fields.h5.partial"));
  // a damaged checkpoint: refused naming the dataset, and kept for the user to look at
  const fs::path bad = fresh("terayee-test-stops-bad");
  fs::copy(dir, bad);
  {
    h5::File f = h5::File::open_rw((bad / "checkpoint.h5").string());
    H5Ldelete(f.id(), "/clock/steps", H5P_DEFAULT);
    const double clock = -1e8;
    f.write("/clock/steps", {1}, &clock, "");
  }
  std::string out;
  CHECK(terayee_run(bad, " --resume", out) == 2);
  CHECK(out.find("/clock/steps") != std::string::npos);
  CHECK(fs::exists(bad / "checkpoint.h5"));
  fs::remove_all(bad);
  // SIGHUP (a closed terminal) stops like Ctrl-C: checkpoint, then 128 + 1
  const fs::path hup = fresh("terayee-test-stops-hup");
  CHECK(terayee_run(hup, " --set time.stop=20ns", "timeout --preserve-status -s HUP 2") == 129);
  CHECK(fs::exists(hup / "checkpoint.h5"));
  fs::remove_all(hup);
  fs::remove_all(dir);
}

TEST_CASE("kill -9 anywhere, then --resume, ends with the bits of a straight run") {
  const fs::path a = fresh("terayee-test-kill-straight"), b = fresh("terayee-test-kill-resumed");
  REQUIRE(terayee_run(a, "") == 0);
  const std::string every = " --checkpoint-steps 50";
  // before the first checkpoint: the resume starts again from step 0
  CHECK(terayee_run(b, every, "TERAYEE_KILL_AT=step:30") == 128 + 9);
  CHECK_FALSE(fs::exists(b / "checkpoint.h5"));
  // inside the second checkpoint write: the first one (step 50) is intact
  CHECK(terayee_run(b, every + " --resume", "TERAYEE_KILL_AT=checkpoint:2") == 128 + 9);
  CHECK(fs::exists(b / "checkpoint.h5"));
  // at a step between checkpoints, then with the result written but not renamed, then renamed
  CHECK(terayee_run(b, every + " --resume", "TERAYEE_KILL_AT=step:170") == 128 + 9);
  CHECK(terayee_run(b, every + " --resume", "TERAYEE_KILL_AT=result") == 128 + 9);
  CHECK_FALSE(fs::exists(b / "fields.h5"));
  CHECK(terayee_run(b, every + " --resume", "TERAYEE_KILL_AT=renamed") == 128 + 9);
  CHECK(fs::exists(b / "fields.h5"));
  REQUIRE(terayee_run(b, every + " --resume") == 0);
  CHECK_FALSE(fs::exists(b / "checkpoint.h5"));
  CHECK_FALSE(fs::exists(b / "fields.h5.partial"));
  same_bits(a, b);
  fs::remove_all(a);
  fs::remove_all(b);
}

TEST_CASE("a scene above 64 KB resolved is checkpointed and resumed") {
  const fs::path dir = fresh("terayee-test-big-scene");
  const std::string title = " --set 'title=" + std::string(70000, 'T') + "'";
  std::string out;
  CHECK(terayee_run(dir, title + " --checkpoint-steps 20 --stop-at-step 60", out) == 0);
  INFO(out.substr(0, 2000));
  REQUIRE(fs::exists(dir / "checkpoint.h5"));
  CHECK(terayee_run(dir, title + " --resume") == 0);
  CHECK(h5::File::open((dir / "fields.h5").string()).read_attribute("/", "title").size() == 70000);
  fs::remove_all(dir);
}

TEST_CASE("a run whose snapshots fall after its end is stopped and resumed (no frame series to find)") {
  // every 20 ps in a 10 ps run: no frame, so the partial results hold no /snapshots; the
  // resume looked for them and refused the run ("/snapshots/Ez: missing")
  const fs::path dir = fresh("terayee-test-no-frames");
  const std::string sets = " --set outputs.0.snapshots.every=20ps";
  CHECK(terayee_run(dir, sets + " --stop-at-step 40") == 0);
  REQUIRE(fs::exists(dir / "checkpoint.h5"));
  std::string out;
  CHECK(terayee_run(dir, sets + " --resume", out) == 0);
  INFO(out);
  CHECK(fs::exists(dir / "fields.h5"));
  CHECK_FALSE(fs::exists(dir / "checkpoint.h5"));
  fs::remove_all(dir);
}

TEST_CASE("a movie named '-x.mp4' is that file, not an ffmpeg option") {
  const fs::path dir = fresh("terayee-test-dash-movie");
  fs::create_directories(dir);
  const fs::path here = fs::current_path();
  fs::current_path(dir);
  {
    std::vector<uint8_t> frame(16 * 16 * 4, 128);
    MovieWriter m("-x.mp4", 16, 16, 10);
    for (int k = 0; k < 3; ++k) m.add(frame.data(), 16 * 4);
    m.finish();
  }
  fs::current_path(here);
  REQUIRE(fs::exists(dir / "-x.mp4"));
  CHECK_FALSE(fs::exists(dir / "-x.mp4.tmp"));
  std::ifstream in(dir / "-x.mp4", std::ios::binary);
  char box[8] = {};
  in.read(box, 8);
  CHECK(std::string(box + 4, 4) == "ftyp");  // an MP4 starts with its ftyp box (ISO/IEC 14496-12, 4.3)
  fs::remove_all(dir);
}

TEST_CASE("a field that becomes non-finite stops the run with its step, node, medium and field (exit 1)") {
  // A source near the largest double (IEEE 754: about 1.797e308) overflows to infinity once
  // the fields add up, a few hundred steps in.
  const fs::path dir = fresh("terayee-test-nonfinite");
  std::string out;
  CHECK(terayee_run(dir, " --set time.stop=30ps --set 'sources.0.beam.amplitude=1.79e308 V/m' --checkpoint-steps 100",
                    out) == 1);
  INFO(out);
  CHECK(out.find("error: the field E") != std::string::npos);
  CHECK(out.find("became non-finite by step") != std::string::npos);
  CHECK(out.find("in vacuum") != std::string::npos);  // the beam blows up before the window
  CHECK(out.find("--set time.step-fraction=") != std::string::npos);
  CHECK(out.find("last good checkpoint") != std::string::npos);
  CHECK(fs::exists(dir / "checkpoint.h5"));  // written from a finite state, kept
  CHECK(fs::exists(dir / "fields.h5.partial"));
  CHECK_FALSE(fs::exists(dir / "fields.h5"));
  fs::remove_all(dir);
}

TEST_CASE("a run folder from disk is input: render refuses damaged snapshot shapes naming the dataset") {
  const fs::path dir = fresh("terayee-test-damaged-run");
  REQUIRE(terayee_run(dir, "") == 0);
  const auto render = [&](std::string& out) {
    const std::string cmd = std::string(TERAYEE_BINARY) + " render '" + dir.string() +
                            "' --field Ez --time 4ps --out '" + (dir / "still").string() + "' 2>&1";
    FILE* p = popen(cmd.c_str(), "r");
    std::array<char, 4096> buf;
    out.clear();
    while (size_t n = fread(buf.data(), 1, buf.size(), p)) out.append(buf.data(), n);
    const int status = pclose(p);
    return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  };
  std::string out;
  {  // coordinates that no longer match the frames: an empty x axis
    h5::File f = h5::File::open_rw((dir / "fields.h5").string());
    H5Ldelete(f.id(), "/grid/Ez/x", H5P_DEFAULT);
    f.write("/grid/Ez/x", {0}, static_cast<const double*>(nullptr), "m");
  }
  CHECK(render(out) == 2);
  CHECK(out.find("/snapshots/Ez: its shape is not") != std::string::npos);
  {  // a time axis of another rank
    h5::File f = h5::File::open_rw((dir / "fields.h5").string());
    H5Ldelete(f.id(), "/snapshots/time", H5P_DEFAULT);
    const double t[4] = {0, 1, 2, 3};
    f.write("/snapshots/time", {2, 2}, t, "s");
  }
  CHECK(render(out) == 2);
  CHECK(out.find("/snapshots/time: has 2 dimensions, expected 1") != std::string::npos);
  fs::remove_all(dir);
}

TEST_CASE("a second Ctrl-C while the checkpoint is written does not cut it short") {
  const fs::path dir = fresh("terayee-test-double-int");
  // two SIGINTs 20 ms apart, 2 s into a long run: the checkpoint is complete and resumes
  const std::string cmd = "sh -c '" + std::string(TERAYEE_BINARY) + " run \"" + kScene + "\" -o \"" + dir.string() +
                          "\" --threads 2 --set time.stop=20ns --quiet & p=$!; sleep 2; kill -INT $p; sleep 0.02; "
                          "kill -INT $p; wait $p'";
  const int status = std::system(cmd.c_str());
  CHECK(WEXITSTATUS(status) == 128 + 2);
  REQUIRE(fs::exists(dir / "checkpoint.h5"));
  CHECK_FALSE(fs::exists(dir / "checkpoint.h5.tmp"));
  const auto steps = h5::File::open((dir / "checkpoint.h5").string()).read_checked("/clock/steps", {1});
  CHECK(steps[0] > 0);
  fs::remove_all(dir);
}
