/// \file test_xdmf.cpp
/// \brief fields.xmf against the XDMF 3 model (xdmf.org, "XDMF Model and Format"): parsed
/// as XML (expat), a Temporal collection holding one Grid per frame with its Time, every
/// snapshot field a Uniform grid in each (2DRectMesh "ny nx", VXVY geometry), and every
/// HDF reference naming a dataset of fields.h5 that exists with the stated shape. The
/// per-frame datasets must hold the same values as the frame read from the series with
/// HDF5's own hyperslab selection. What ParaView makes of it: tools/paraview-check.sh.
#include <doctest/doctest.h>
#include <expat.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <sstream>

#include "io/run/hdf5_file.h"
#include "tests/helpers.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {

/// An XML element: its name, attributes, text and children.
struct Node {
  std::string name, text;
  std::map<std::string, std::string> attr;
  std::vector<std::unique_ptr<Node>> kids;
  std::vector<const Node*> all(const std::string& n) const {
    std::vector<const Node*> out;
    for (const auto& k : kids)
      if (k->name == n) out.push_back(k.get());
    return out;
  }
  const Node& one(const std::string& n) const {
    const auto v = all(n);
    REQUIRE_MESSAGE(v.size() == 1, name, " has ", v.size(), " ", n);
    return *v[0];
  }
  std::string at(const std::string& a) const {
    const auto it = attr.find(a);
    return it == attr.end() ? "" : it->second;
  }
};

/// Parses with expat; an XML error fails the test with expat's message and line.
std::unique_ptr<Node> parse_xml(const std::string& text) {
  struct State {
    std::unique_ptr<Node> root;
    std::vector<Node*> open;
  } st;
  XML_Parser p = XML_ParserCreate(nullptr);
  XML_SetUserData(p, &st);
  XML_SetElementHandler(
      p,
      [](void* u, const XML_Char* name, const XML_Char** atts) {
        auto& s = *static_cast<State*>(u);
        auto n = std::make_unique<Node>();
        n->name = name;
        for (int i = 0; atts[i]; i += 2) n->attr[atts[i]] = atts[i + 1];
        Node* raw = n.get();
        if (s.open.empty())
          s.root = std::move(n);
        else
          s.open.back()->kids.push_back(std::move(n));
        s.open.push_back(raw);
      },
      [](void* u, const XML_Char*) { static_cast<State*>(u)->open.pop_back(); });
  XML_SetCharacterDataHandler(p, [](void* u, const XML_Char* s, int len) {
    auto& st = *static_cast<State*>(u);
    if (!st.open.empty()) st.open.back()->text.append(s, len);
  });
  const bool ok = XML_Parse(p, text.data(), static_cast<int>(text.size()), 1) == XML_STATUS_OK;
  const std::string why = ok ? "" : XML_ErrorString(XML_GetErrorCode(p));
  const long line = XML_GetCurrentLineNumber(p);
  XML_ParserFree(p);
  REQUIRE_MESSAGE(ok, "fields.xmf:", line, ": ", why);
  return std::move(st.root);
}

std::vector<hsize_t> dims(const std::string& s) {
  std::istringstream in(s);
  std::vector<hsize_t> out;
  for (hsize_t d; in >> d;) out.push_back(d);
  return out;
}

std::string trim(const std::string& s) {
  const auto a = s.find_first_not_of(" \n\t"), b = s.find_last_not_of(" \n\t");
  return a == std::string::npos ? "" : s.substr(a, b - a + 1);
}

/// "fields.h5:/path" -> "/path", after checking the dataset exists with `shape`.
std::string checked_ref(const h5::File& h, const Node& item, const std::vector<hsize_t>& shape) {
  CHECK(item.at("Format") == "HDF");
  const std::string ref = trim(item.text);
  REQUIRE(ref.rfind("fields.h5:", 0) == 0);
  const std::string path = ref.substr(10);
  REQUIRE_MESSAGE(h.exists(path), path);
  CHECK(h.shape(path) == shape);
  CHECK(dims(item.at("Dimensions")) == shape);
  return path;
}

/// Checks the run folder's fields.xmf against its fields.h5 as the file comment says.
void check_xdmf(const fs::path& dir, int precision) {
  std::ifstream in(dir / "fields.xmf");
  std::stringstream ss;
  ss << in.rdbuf();
  const auto root = parse_xml(ss.str());
  REQUIRE(root->name == "Xdmf");
  CHECK(root->at("Version") == "3.0");
  const Node& series = root->one("Domain").one("Grid");
  CHECK(series.at("CollectionType") == "Temporal");
  const auto h = h5::File::open((dir / "fields.h5").string());
  const auto times = h.read("/snapshots/time");
  std::vector<std::string> fields;
  for (const auto& m : h.members("/snapshots"))
    if (m != "time") fields.push_back(m);
  const auto frames = series.all("Grid");
  REQUIRE(frames.size() == times.size());
  REQUIRE(!fields.empty());
  std::vector<double> a, b;
  for (size_t k = 0; k < frames.size(); ++k) {
    const Node& fr = *frames[k];
    CHECK(fr.at("CollectionType") == "Spatial");
    CHECK(std::stod(fr.one("Time").at("Value")) == times[k]);  // every field under the frame's one time
    const auto grids = fr.all("Grid");
    REQUIRE(grids.size() == fields.size());
    for (size_t q = 0; q < fields.size(); ++q) {
      const Node& g = *grids[q];
      const std::string& name = fields[q];
      CHECK(g.at("Name") == name);
      CHECK(g.all("Time").empty());  // no time of its own: it would split the frame again
      const Node& info = g.one("Information");
      CHECK(info.at("Name") == "time-offset");
      CHECK(std::stod(info.at("Value")) == std::stod(h.read_attribute("/snapshots/" + name, "time-offset")));
      const auto s = h.shape("/snapshots/" + name);
      REQUIRE(s.size() == 3);
      const Node& topo = g.one("Topology");
      CHECK(topo.at("TopologyType") == "2DRectMesh");
      CHECK(dims(topo.at("Dimensions")) == std::vector<hsize_t>{s[1], s[2]});
      const Node& geo = g.one("Geometry");
      CHECK(geo.at("GeometryType") == "VXVY");
      const auto axes = geo.all("DataItem");
      REQUIRE(axes.size() == 2);
      CHECK(checked_ref(h, *axes[0], {s[2]}) == "/grid/" + name + "/x");
      CHECK(checked_ref(h, *axes[1], {s[1]}) == "/grid/" + name + "/y");
      const Node& att = g.one("Attribute");
      CHECK(att.at("Center") == "Node");
      const Node& item = att.one("DataItem");
      CHECK(item.at("Precision") == std::to_string(precision));
      CHECK(item.at("ItemType").empty());  // a plain item: the XDMF 3 reader skips HyperSlab ones
      const std::string path = checked_ref(h, item, {s[1], s[2]});
      h.read_frame("/snapshots/" + name, k, a);
      b = h.read(path);
      CHECK_MESSAGE(a == b, path, " is not frame ", k, " of /snapshots/", name);
    }
  }
}

}  // namespace

TEST_CASE("fields.xmf: one grid per frame time holding every field, read from datasets that exist") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/window-beam.yaml";
  const fs::path dir = fs::temp_directory_path() / "terayee-test-xdmf";
  for (const char* precision : {"double", "single"}) {
    CAPTURE(precision);
    fs::remove_all(dir);
    REQUIRE(test::shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + dir.string() +
                        "' --threads 2 --set time.stop=5ps --set outputs.0.snapshots.every=2ps --set time.precision=" +
                        precision) == 0);
    check_xdmf(dir, precision[0] == 's' ? 4 : 8);
  }
  fs::remove_all(dir);
}
