//===- IncludeTest.cpp - Includes resolve safely ---------------------------===//
//
// Includes resolve relative to the including file, then along
// --include-path, and may not leave the allowed roots (DESIGN.md, "Bad
// input"). These tests touch the file system because files are the point.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <sys/stat.h>
#include <unistd.h>

using namespace revbound;
namespace fs = std::filesystem;

namespace {

class Includes : public ::testing::Test {
protected:
  void SetUp() override {
    Root = fs::temp_directory_path() /
           ("revbound-include-" + std::to_string(::getpid()) + "-" +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(Root);
    fs::create_directories(Root / "lib");
    fs::create_directories(Root / "outside");
  }
  void TearDown() override { fs::remove_all(Root); }

  void write(const fs::path &P, const std::string &Text) {
    std::ofstream(P, std::ios::binary) << Text;
  }

  /// Elaborates `Main` (a path under Root/lib or Root); returns the error text.
  std::string run(const fs::path &Main, SourceOptions SO = {},
                  qasm::FrontendOptions Opts = {}) {
    SourceFiles Files(SO);
    llvm::Expected<unsigned> Id = Files.loadMain(Main.string());
    std::string Error;
    auto Report = [&](const DiagnosticError &D) {
      Error = formatDiagnostic(Files.mgr(), D.diagnostic());
    };
    if (!Id) {
      llvm::handleAllErrors(Id.takeError(), Report);
      return Error;
    }
    DiagnosticSink Warnings;
    llvm::Expected<ir::Circuit> C = qasm::buildCircuit(Files, *Id, Opts, Warnings);
    if (!C)
      llvm::handleAllErrors(C.takeError(), Report);
    else
      NumOps = C->Ops.size();
    return Error;
  }

  fs::path Root;
  size_t NumOps = 0;
};

} // namespace

TEST_F(Includes, RelativeToTheIncludingFile) {
  write(Root / "lib" / "defs.inc", "gate flip a { U(pi,0,pi) a; }\n");
  write(Root / "lib" / "main.qasm",
        "OPENQASM 2.0;\ninclude \"defs.inc\";\nqreg q[2];\nflip q;\n");
  EXPECT_EQ(run(Root / "lib" / "main.qasm"), "");
  EXPECT_EQ(NumOps, 2u);
}

TEST_F(Includes, MissingFile) {
  write(Root / "main.qasm", "OPENQASM 2.0;\ninclude \"nope.inc\";\n");
  std::string Main = (Root / "main.qasm").string();
  EXPECT_EQ(run(Root / "main.qasm"),
            Main + ":2:9: error: cannot find include file 'nope.inc'\n"
                   "include \"nope.inc\";\n"
                   "        ^~~~~~~~~~\n");
}

TEST_F(Includes, CannotEscapeTheRoots) {
  write(Root / "outside" / "evil.inc", "gate e a { U(0,0,0) a; }\n");
  write(Root / "lib" / "main.qasm",
        "OPENQASM 2.0;\ninclude \"../outside/evil.inc\";\n");
  EXPECT_NE(run(Root / "lib" / "main.qasm").find("outside the allowed roots"),
            std::string::npos);
  // Allowed once the folder is named as an include path.
  SourceOptions SO;
  SO.IncludePaths.push_back((Root / "outside").string());
  EXPECT_EQ(run(Root / "lib" / "main.qasm", SO), "");
}

TEST_F(Includes, AbsolutePathsAndSymlinksAndSpecialFiles) {
  write(Root / "lib" / "abs.qasm", "OPENQASM 2.0;\ninclude \"/etc/passwd\";\n");
  EXPECT_NE(run(Root / "lib" / "abs.qasm").find("is an absolute path"),
            std::string::npos);
  fs::create_symlink("/dev/zero", Root / "lib" / "zero.inc");
  write(Root / "lib" / "zero.qasm", "OPENQASM 2.0;\ninclude \"zero.inc\";\n");
  EXPECT_NE(run(Root / "lib" / "zero.qasm").find("outside the allowed roots"),
            std::string::npos);
  fs::create_directories(Root / "lib" / "dir.inc");
  write(Root / "lib" / "dir.qasm", "OPENQASM 2.0;\ninclude \"dir.inc\";\n");
  EXPECT_NE(run(Root / "lib" / "dir.qasm").find("is not a regular file"),
            std::string::npos);
  ASSERT_EQ(::mkfifo((Root / "lib" / "fifo.inc").c_str(), 0600), 0);
  write(Root / "lib" / "fifo.qasm", "OPENQASM 2.0;\ninclude \"fifo.inc\";\n");
  EXPECT_NE(run(Root / "lib" / "fifo.qasm").find("is not a regular file"),
            std::string::npos);
}

TEST_F(Includes, CyclesAndDepth) {
  write(Root / "lib" / "a.inc", "include \"b.inc\";\n");
  write(Root / "lib" / "b.inc", "include \"a.inc\";\n");
  write(Root / "lib" / "main.qasm", "OPENQASM 2.0;\ninclude \"a.inc\";\n");
  EXPECT_NE(run(Root / "lib" / "main.qasm").find("include cycle"),
            std::string::npos);
  for (int I = 0; I < 5; ++I)
    write(Root / "lib" / ("d" + std::to_string(I) + ".inc"),
          "include \"d" + std::to_string(I + 1) + ".inc\";\n");
  write(Root / "lib" / "d5.inc", "\n");
  write(Root / "lib" / "deep.qasm", "OPENQASM 2.0;\ninclude \"d0.inc\";\n");
  qasm::FrontendOptions Opts;
  Opts.Parser.MaxIncludeDepth = 3;
  EXPECT_NE(run(Root / "lib" / "deep.qasm", {}, Opts)
                .find("includes nest deeper than 3 files"),
            std::string::npos);
  Opts.Parser.MaxIncludeDepth = 16;
  EXPECT_EQ(run(Root / "lib" / "deep.qasm", {}, Opts), "");
}

TEST_F(Includes, FileSizeLimit) {
  write(Root / "lib" / "big.inc", std::string(4096, '\n'));
  write(Root / "lib" / "main.qasm", "OPENQASM 2.0;\ninclude \"big.inc\";\n");
  SourceOptions SO;
  SO.MaxFileBytes = 1024;
  EXPECT_NE(run(Root / "lib" / "main.qasm", SO).find("over the limit of 1024 bytes"),
            std::string::npos);
}

TEST_F(Includes, StandardLibraryReplacement) {
  write(Root / "outside" / "mylib.inc", "gate h a { U(pi/2,0,pi) a; }\n");
  write(Root / "lib" / "main.qasm",
        "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[1];\nh q[0];\n");
  qasm::FrontendOptions Opts;
  Opts.Parser.StandardLibraryPath = (Root / "outside" / "mylib.inc").string();
  EXPECT_EQ(run(Root / "lib" / "main.qasm", {}, Opts), "");
  write(Root / "lib" / "cx.qasm",
        "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[2];\ncx q[0], q[1];\n");
  EXPECT_NE(run(Root / "lib" / "cx.qasm", {}, Opts).find("unknown gate 'cx'"),
            std::string::npos);
}

TEST_F(Includes, AbsoluteIncludeWhenEscapeIsAllowed) {
  write(Root / "outside" / "defs.inc", "gate flip a { U(pi,0,pi) a; }\n");
  write(Root / "lib" / "main.qasm",
        "OPENQASM 2.0;\ninclude \"" + (Root / "outside" / "defs.inc").string() +
            "\";\nqreg q[1];\nflip q[0];\n");
  EXPECT_NE(run(Root / "lib" / "main.qasm").find("is an absolute path"),
            std::string::npos);
  SourceOptions SO;
  SO.AllowIncludeEscape = true;
  EXPECT_EQ(run(Root / "lib" / "main.qasm", SO), "");
  EXPECT_EQ(NumOps, 1u);
}

TEST_F(Includes, LibraryIncludedTwiceIsAWarning) {
  test::Elaborated E = test::elaborate(
      "OPENQASM 2.0;\ninclude \"qelib1.inc\";\ninclude \"qelib1.inc\";\n"
      "qreg q[1];\nh q[0];\n");
  ASSERT_TRUE(E.Circuit) << E.Error;
  ASSERT_EQ(E.Warnings.size(), 1u);
  EXPECT_EQ(E.Warnings[0],
            "test.qasm:3:9: warning: 'qelib1.inc' is included again; the "
            "second include is ignored\n"
            "include \"qelib1.inc\";\n"
            "        ^~~~~~~~~~~~\n");
}

// A --stdlib file is input like any other: its nesting is limited too
// (found in review: a 50000-level library overflowed the stack).
TEST_F(Includes, StandardLibraryReplacementHasTheNestingLimit) {
  std::string Lib = "gate l0 a { U(0,0,0) a; }\n";
  for (int I = 1; I <= 30; ++I)
    Lib += "gate l" + std::to_string(I) + " a { l" + std::to_string(I - 1) + " a; }\n";
  write(Root / "outside" / "deep.inc", Lib);
  write(Root / "lib" / "main.qasm", "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n");
  qasm::FrontendOptions Opts;
  Opts.Parser.StandardLibraryPath = (Root / "outside" / "deep.inc").string();
  Opts.Limits.MaxNesting = 10;
  EXPECT_NE(run(Root / "lib" / "main.qasm", {}, Opts).find("--max-nesting"),
            std::string::npos);
  // The built-in library is exempt: even a limit of 1 reads qelib1.inc.
  Opts.Parser.StandardLibraryPath.clear();
  EXPECT_EQ(run(Root / "lib" / "main.qasm", {}, Opts), "");
}
