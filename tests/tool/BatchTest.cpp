//===- BatchTest.cpp - Many files: folders, --jobs, jsonl, progress -------===//
//
// Runs the real executable on batches: which files a folder stands for and
// in what order, outputs byte-identical whatever --jobs is (DESIGN.md: same
// input, same bytes), failed files' diagnostics in input order with exit 2,
// JSON Lines equal to the json format's entries, no progress line when
// standard error is not a terminal, and --jobs 0 refused with exit 2.
//
//===----------------------------------------------------------------------===//
#include "Batch.h"
#include "ToolRunner.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

namespace fs = std::filesystem;

namespace {

using revbound::test::Outcome;
using revbound::test::slurp;

class Batch : public revbound::test::ToolTest {
protected:
  /// Writes `Text` to `Name`, creating folders on the way.
  void put(const std::string &Name, const std::string &Text) {
    fs::create_directories((Dir / Name).parent_path());
    write(Name, Text);
  }

  /// Writes the mixed batch below into `b/` and returns the files in the
  /// order they are named on the command line.
  std::vector<std::string> writeMixedBatch();
};

const char *Bell = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                   "qreg q[2];\ncreg c[2];\nh q[0];\ncx q[0], q[1];\n"
                   "measure q -> c;\n";

// A Toffoli onto an ancilla leaves it holding a[0] AND a[1]: dirty, which
// the classical engine (BDDs, a process-wide lock) proves with an input.
const char *DirtyAncilla =
    "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
    "//! input a\n//! ancilla anc\n"
    "qreg a[2];\nqreg anc[1];\nccx a[0], a[1], anc[0];\n";

// h then reset: the reset erases one full bit (the density engine).
const char *ResetAfterH = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n"
                          "qreg q[1];\nh q[0];\nreset q[0];\n";

// A qubit used twice in one CX: OpenQASM 2.0 (Cross et al., arXiv:1707.03429,
// section 3) forbids it; the diagnostic's text is ReportCommandTest's.
const char *TwiceUsed = "OPENQASM 2.0;\nqreg q[2];\nCX q[0], q[0];\n";
const char *TwiceUsedMessage =
    "{}:3:10: error: qubit q[0] is used twice in one application of 'CX'\n"
    "CX q[0], q[0];\n"
    "         ^~~~\n";

std::string replaceName(std::string Pattern, const std::string &Name) {
  Pattern.replace(Pattern.find("{}"), 2, Name);
  return Pattern;
}

std::vector<std::string> Batch::writeMixedBatch() {
  const char *Kinds[] = {Bell, DirtyAncilla, ResetAfterH};
  std::vector<std::string> Files;
  for (int I = 0; I < 24; ++I) {
    std::string Name = "b/f" + std::to_string(100 + I) + ".qasm";
    // Bad files early, in the middle and last, so that a fast later file
    // must wait for them.
    bool Bad = I == 1 || I == 13 || I == 23;
    // Vary the size so that files finish out of order on several threads.
    std::string Text = Bad ? TwiceUsed : Kinds[I % 3];
    if (Bad || I % 3 != 1) // the ancilla file has no register q
      for (int K = 0; K < (I * 37) % 200; ++K)
        Text += "barrier q;\n";
    put(Name, Text);
    Files.push_back(Name);
  }
  return Files;
}

std::string joined(const std::vector<std::string> &Files) {
  std::string S;
  for (const std::string &F : Files)
    S += " '" + F + "'";
  return S;
}

std::vector<std::string> jsonlFiles(const std::string &Out) {
  std::vector<std::string> Files;
  std::istringstream In(Out);
  for (std::string Line; std::getline(In, Line);)
    Files.push_back(nlohmann::json::parse(Line)["file"]);
  return Files;
}

} // namespace

// A folder stands for its .qasm files, sorted by path as bytes (ASCII,
// ANSI X3.4-1986: '-' 0x2D < '.' 0x2E < '/' 0x2F < 'A' 0x41 < 'a' 0x61),
// recursively, at its place among the other arguments; other names, links
// and other extensions are not taken (docs/formats.md, "Many files").
TEST_F(Batch, FolderExpansionOrder) {
  for (const char *Name : {"d/b.qasm", "d/a.qasm", "d/A.qasm", "d/a-b.qasm",
                           "d/a/z.qasm", "d/sub/deeper/c.qasm", "one.qasm",
                           "two.qasm", "outside/o.qasm", "outside.qasm"})
    put(Name, Bell);
  put("d/notes.txt", "not a circuit");
  put("d/upper.QASM", Bell);
  put("d/sub/qasm", Bell);
  fs::create_symlink("../outside.qasm", Dir / "d/link.qasm");
  fs::create_directory_symlink("../outside", Dir / "d/linked");
  const std::vector<std::string> Expected = {
      "one.qasm",   "d/A.qasm", "d/a-b.qasm",          "d/a.qasm",
      "d/a/z.qasm", "d/b.qasm", "d/sub/deeper/c.qasm", "two.qasm"};
  for (const char *Folder : {"d", "d/"}) {
    Outcome R = invoke(std::string("report --format jsonl one.qasm ") + Folder +
                       " two.qasm");
    ASSERT_EQ(R.Exit, 0) << R.Err;
    EXPECT_EQ(jsonlFiles(R.Out), Expected) << Folder;
  }
  // A link named on the command line is followed: the user chose it.
  Outcome L = invoke("report --format jsonl d/linked");
  ASSERT_EQ(L.Exit, 0) << L.Err;
  EXPECT_EQ(jsonlFiles(L.Out), std::vector<std::string>{"d/linked/o.qasm"});
}

TEST_F(Batch, BadInputLists) {
  fs::create_directories(Dir / "empty/sub");
  put("empty/sub/readme.txt", "no circuits here");
  Outcome Empty = invoke("report empty");
  EXPECT_EQ(Empty.Exit, 2);
  EXPECT_EQ(Empty.Out, "");
  EXPECT_EQ(Empty.Err,
            "revbound: error: folder 'empty' holds no .qasm files\n");
  // Standard input can be read once.
  Outcome Twice = invoke("report - -", Bell);
  EXPECT_EQ(Twice.Exit, 2);
  EXPECT_EQ(Twice.Err, "revbound: error: standard input ('-') is named twice; "
                       "it can be read only once\n");
}

TEST_F(Batch, JobsZeroIsAUsageError) {
  put("bell.qasm", Bell);
  for (const char *Bad : {"0", "-1", "two", "100000"}) {
    Outcome R = invoke(std::string("report --jobs ") + Bad + " bell.qasm");
    EXPECT_EQ(R.Exit, 2) << Bad;
    EXPECT_EQ(R.Out, "") << Bad;
    EXPECT_NE(R.Err.find("--jobs"), std::string::npos) << Bad << ": " << R.Err;
  }
  EXPECT_EQ(invoke("report -j 1 bell.qasm").Exit, 0);
}

// Every format, every job count: the same stdout, stderr and exit code,
// failed files included (exit 2, their diagnostics in input order).
TEST_F(Batch, SameBytesWhateverTheJobCount) {
  std::vector<std::string> Files = writeMixedBatch();
  std::string Expected;
  for (size_t I : {1, 13, 23})
    Expected += replaceName(TwiceUsedMessage, Files[I]);
  for (const char *Format : {"text", "json", "jsonl"}) {
    Outcome One = invoke(std::string("report --format ") + Format +
                         " --jobs 1" + joined(Files));
    EXPECT_EQ(One.Exit, 2) << Format;
    EXPECT_EQ(One.Err, Expected) << Format;
    // text and json print nothing when a file failed; jsonl has streamed
    // the 21 good files, in order.
    if (std::string(Format) == "jsonl") {
      std::vector<std::string> Good;
      for (size_t I = 0; I < Files.size(); ++I)
        if (I != 1 && I != 13 && I != 23)
          Good.push_back(Files[I]);
      EXPECT_EQ(jsonlFiles(One.Out), Good);
    } else {
      EXPECT_EQ(One.Out, "") << Format;
    }
    for (const char *Jobs : {"2", "8"}) {
      Outcome N = invoke(std::string("report --format ") + Format + " --jobs " +
                         Jobs + joined(Files));
      EXPECT_EQ(N.Exit, One.Exit) << Format << " --jobs " << Jobs;
      EXPECT_EQ(N.Out, One.Out) << Format << " --jobs " << Jobs;
      EXPECT_EQ(N.Err, One.Err) << Format << " --jobs " << Jobs;
    }
  }
  // Without the bad files: exit 0 and, again, the same bytes.
  std::vector<std::string> Good;
  for (size_t I = 0; I < Files.size(); ++I)
    if (I != 1 && I != 13 && I != 23)
      Good.push_back(Files[I]);
  for (const char *Format : {"text", "json", "jsonl"}) {
    Outcome One = invoke(std::string("report --format ") + Format +
                         " --jobs 1" + joined(Good));
    ASSERT_EQ(One.Exit, 0) << One.Err;
    EXPECT_FALSE(One.Out.empty());
    for (const char *Jobs : {"2", "8"}) {
      Outcome N = invoke(std::string("report --format ") + Format + " --jobs " +
                         Jobs + joined(Good));
      EXPECT_EQ(N.Exit, 0);
      EXPECT_EQ(N.Out, One.Out) << Format << " --jobs " << Jobs;
      EXPECT_EQ(N.Err, One.Err) << Format << " --jobs " << Jobs;
    }
  }
}

// JSON Lines (jsonlines.org): one valid JSON value per line, '\n'-ended.
// Each line is the json format's circuit entry with "schema" first.
TEST_F(Batch, JsonLinesEqualTheJsonEntries) {
  std::vector<std::string> Files = writeMixedBatch();
  std::vector<std::string> Good;
  for (size_t I = 0; I < Files.size(); ++I)
    if (I != 1 && I != 13 && I != 23)
      Good.push_back(Files[I]);
  Outcome Json = invoke("report --format json" + joined(Good));
  Outcome Lines = invoke("report --format jsonl --jobs 2" + joined(Good));
  ASSERT_EQ(Json.Exit, 0) << Json.Err;
  ASSERT_EQ(Lines.Exit, 0) << Lines.Err;
  nlohmann::json Whole = nlohmann::json::parse(Json.Out);
  ASSERT_FALSE(Lines.Out.empty());
  EXPECT_EQ(Lines.Out.back(), '\n');
  std::istringstream In(Lines.Out);
  size_t N = 0;
  for (std::string Line; std::getline(In, Line); ++N) {
    nlohmann::ordered_json L = nlohmann::ordered_json::parse(Line);
    ASSERT_TRUE(L.is_object());
    EXPECT_EQ(L.begin().key(), "schema");
    EXPECT_EQ(L["schema"], Whole["schema"]);
    L.erase("schema");
    ASSERT_LT(N, Whole["circuits"].size());
    EXPECT_EQ(nlohmann::json::parse(L.dump()), Whole["circuits"][N]) << Line;
  }
  EXPECT_EQ(N, Good.size());
  // The classical engine ran on the ancilla files (f104 is one): the
  // Toffoli leaves anc = a[0] AND a[1], 1 only on input a = 11 (its truth
  // table, common practice), so the ancilla is dirty with that witness.
  const nlohmann::json &Anc = Whole["circuits"][3];
  EXPECT_EQ(Anc["file"], "b/f104.qasm");
  EXPECT_EQ(Anc["erasures"]["engine"], "classical");
  EXPECT_EQ(Anc["ancillas"][0]["clean"], false);
  EXPECT_EQ(Anc["ancillas"][0]["counterexample"],
            nlohmann::json({{"a", "11"}}));
}

// -o writes jsonl through a temporary file too: the same bytes as stdout,
// no temporary left, and nothing written when a file failed.
TEST_F(Batch, JsonLinesToAFile) {
  std::vector<std::string> Files = writeMixedBatch();
  std::vector<std::string> Good(Files.begin() + 2, Files.begin() + 10);
  Outcome Std = invoke("report --format jsonl" + joined(Good));
  Outcome ToFile = invoke("report --format jsonl -o out.jsonl" + joined(Good));
  ASSERT_EQ(ToFile.Exit, 0) << ToFile.Err;
  EXPECT_EQ(ToFile.Out, "");
  EXPECT_EQ(slurp(Dir / "out.jsonl"), Std.Out);
  Outcome Failed =
      invoke("report --format jsonl -o failed.jsonl" + joined(Files));
  EXPECT_EQ(Failed.Exit, 2);
  EXPECT_FALSE(fs::exists(Dir / "failed.jsonl"));
  int Temps = 0;
  for (const auto &E : fs::directory_iterator(Dir))
    Temps += E.path().filename().string().find(".tmp-") != std::string::npos;
  EXPECT_EQ(Temps, 0);
}

// The shared benchmarks as one folder argument: the files are those the
// documented rule gives, in its order, and the bytes do not depend on
// --jobs.
TEST_F(Batch, SharedBenchmarkFolder) {
  fs::path Shared =
      fs::path(REVBOUND_SHARED_DIR) / "benchmarks/qasmbench/small";
  if (!fs::is_directory(Shared))
    GTEST_SKIP() << "shared benchmarks not found at " << Shared.string();
  std::vector<std::string> Expected;
  for (const auto &E : fs::recursive_directory_iterator(Shared))
    if (E.is_regular_file() && !E.is_symlink() &&
        E.path().extension() == ".qasm")
      Expected.push_back(E.path().string());
  std::sort(Expected.begin(), Expected.end());
  Outcome One =
      invoke("report --format jsonl --jobs 1 '" + Shared.string() + "'");
  Outcome Two =
      invoke("report --format jsonl --jobs 2 '" + Shared.string() + "'");
  EXPECT_EQ(One.Exit, Two.Exit);
  EXPECT_EQ(One.Out, Two.Out);
  EXPECT_EQ(One.Err, Two.Err);
  // Each file has a line, in the rule's order, or failed with a diagnostic
  // that names it.
  std::vector<std::string> Lines = jsonlFiles(One.Out);
  size_t Next = 0;
  for (const std::string &File : Expected) {
    if (Next < Lines.size() && Lines[Next] == File)
      ++Next;
    else
      EXPECT_NE(One.Err.find(File + ":"), std::string::npos) << File;
  }
  EXPECT_EQ(Next, Lines.size());
  EXPECT_EQ(One.Exit, Next == Expected.size() ? 0 : 2);
}

// runOrdered (src/tool/Batch.h) directly: Take sees 0, 1, 2, ... whatever
// order the Works end in, and no Work starts more than Window ahead of the
// last Take (the bound on held results).
TEST(RunOrdered, TakesInInputOrderWithinTheWindow) {
  using revbound::tool::runOrdered;
  const size_t Count = 120, Window = 6;
  std::atomic<size_t> Taken = 0, Ahead = 0, Running = 0, MostRunning = 0;
  std::vector<size_t> Order;
  runOrdered(
      Count, 4, Window,
      [&](size_t I) {
        size_t Busy = ++Running, Most = MostRunning;
        while (Busy > Most && !MostRunning.compare_exchange_weak(Most, Busy)) {
        }
        size_t Now = I - Taken, Seen = Ahead;
        while (Now > Seen && !Ahead.compare_exchange_weak(Seen, Now)) {
        }
        // Uneven work, so that later items often end first.
        std::this_thread::sleep_for(
            std::chrono::microseconds((I * 7919) % 900));
        --Running;
      },
      [&](size_t I) {
        Order.push_back(I);
        ++Taken;
        return true;
      },
      [] {});
  std::vector<size_t> Expected(Count);
  for (size_t I = 0; I < Count; ++I)
    Expected[I] = I;
  EXPECT_EQ(Order, Expected);
  EXPECT_LT(Ahead.load(), Window);
  // Sleeping Works need no core, so on any machine they overlap: the pool
  // really runs several at once, and never more than its 4 threads.
  EXPECT_GE(MostRunning.load(), 2u);
  EXPECT_LE(MostRunning.load(), 4u);
  // No items, more threads than items: nothing wrong happens.
  size_t Calls = 0;
  runOrdered(
      0, 8, 8, [&](size_t) { ++Calls; }, [&](size_t) { return true; }, [] {});
  EXPECT_EQ(Calls, 0u);
  runOrdered(
      2, 8, 1, [&](size_t) {},
      [&](size_t) {
        ++Calls;
        return true;
      },
      [] {});
  EXPECT_EQ(Calls, 2u);
}

TEST(RunOrdered, StopsWhenTakeSaysSoOrThrows) {
  using revbound::tool::runOrdered;
  std::atomic<size_t> Worked = 0;
  size_t Takes = 0;
  runOrdered(
      1000, 2, 4, [&](size_t) { ++Worked; },
      [&](size_t I) {
        ++Takes;
        return I < 10;
      },
      [] {});
  EXPECT_EQ(Takes, 11u);
  EXPECT_LE(Worked.load(), 11u + 4u);
  Worked = 0;
  EXPECT_THROW(runOrdered(
                   1000, 2, 4, [&](size_t) { ++Worked; },
                   [&](size_t I) -> bool {
                     if (I == 3)
                       throw std::runtime_error("write failed");
                     return true;
                   },
                   [] {}),
               std::runtime_error);
  EXPECT_LE(Worked.load(), 4u + 4u);
}

// The progress line: "DONE/TOTAL files" after a carriage return (CR,
// 0x0D, returns to the line's start: ANSI X3.4 / ECMA-48, from memory),
// erased with spaces; nothing at all when disabled or not yet due.
TEST(ProgressLine, DrawsOnlyWhenEnabledAndDue) {
  using revbound::tool::ProgressLine;
  std::ostringstream Off, Early, On;
  {
    ProgressLine P(3, false, Off, std::chrono::milliseconds(0));
    P.show(1);
  }
  {
    ProgressLine P(3, true, Early, std::chrono::hours(1));
    P.show(1);
  }
  EXPECT_EQ(Off.str(), "");
  EXPECT_EQ(Early.str(), "");
  {
    ProgressLine P(12, true, On, std::chrono::milliseconds(0),
                   std::chrono::milliseconds(0));
    P.show(9);
    P.show(9); // unchanged: not redrawn
    P.show(10);
    P.clear();
    P.clear();
    P.show(12);
  } // the destructor erases the line
  EXPECT_EQ(On.str(), "\r9/12 files\r10/12 files\r           \r"
                      "\r12/12 files\r           \r");
}

// End to end: a run of over two seconds (an exact density simulation of
// 10 qubits through 2500 gates, about 3 s of work on a 2020s core)
// writes nothing but its diagnostics to a standard error that is a file.
// When script(1) is there to give it a terminal and the run really lasted
// long enough, the line shows up there and is erased.
TEST_F(Batch, ProgressOnlyOnATerminal) {
  std::string Text = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\nqreg q[10];\n";
  for (int I = 0; I < 2500; ++I)
    Text += I % 3 == 0 ? "h q[" + std::to_string(I % 10) + "];\n"
                       : "cx q[" + std::to_string(I % 10) + "], q[" +
                             std::to_string((I % 10 + 1 + I % 7) % 10) + "];\n";
  Text += "reset q[0];\n";
  put("slow.qasm", Text);
  put("bell.qasm", Bell);
  const std::string Args = "report --format jsonl --jobs 1 slow.qasm bell.qasm";
  Outcome Quiet = invoke(Args);
  ASSERT_EQ(Quiet.Exit, 0) << Quiet.Err;
  EXPECT_EQ(Quiet.Err, "");
  EXPECT_EQ(jsonlFiles(Quiet.Out),
            (std::vector<std::string>{"slow.qasm", "bell.qasm"}));
  EXPECT_EQ(nlohmann::json::parse(Quiet.Out.substr(
                0, Quiet.Out.find('\n')))["erasures"]["engine"],
            "density");
  if (std::system("command -v script >/dev/null 2>&1") != 0)
    GTEST_SKIP() << "script(1) not installed: the terminal case is not run";
  std::string Cmd = "cd '" + Dir.string() +
                    "' && script -qec \"'" REVBOUND_BINARY "' " + Args +
                    " >out.jsonl\" /dev/null >tty.txt 2>&1";
  auto Start = std::chrono::steady_clock::now();
  ASSERT_EQ(std::system(Cmd.c_str()), 0);
  auto Lasted = std::chrono::steady_clock::now() - Start;
  std::string Tty = slurp(Dir / "tty.txt");
  EXPECT_EQ(slurp(Dir / "out.jsonl"), Quiet.Out);
  if (Lasted < std::chrono::milliseconds(2500))
    GTEST_SKIP() << "the run took under 2.5 s: no progress line was due";
  EXPECT_NE(Tty.find("\r0/2 files"), std::string::npos) << Tty;
  ASSERT_FALSE(Tty.empty());
  EXPECT_EQ(Tty.back(), '\r') << "the line is erased at the end";
}
