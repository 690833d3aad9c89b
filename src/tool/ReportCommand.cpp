//===- ReportCommand.cpp - `revbound report FILE...` ----------------------===//
#include "Commands.h"

#include "revbound/report/HtmlWriter.h"
#include "revbound/report/TableWriters.h"
#include "revbound/report/Writers.h"

#include <algorithm>
#include <memory>

namespace revbound::tool {

namespace {

/// A form of the report. `WriteAll` sees every circuit at once; `WriteOne`
/// is called per circuit in input order and its pieces are written as they
/// come, so a batch is never held whole. One of the two is set.
struct Format {
  const char *Name;
  const char *Help;
  std::string (*WriteAll)(const report::Report &);
  std::string (*WriteOne)(const report::CircuitReport &);
};

const Format Formats[] = {
    {"text", "for people", report::writeText, nullptr},
    {"json", "one object, docs/json.md", report::writeJson, nullptr},
    {"jsonl", "one JSON object per circuit and line, streamed", nullptr,
     report::writeJsonLine},
    {"csv", "one line per circuit, docs/compare.md", report::writeCsv, nullptr},
    {"markdown", "one row per metric, docs/compare.md", report::writeMarkdown,
     nullptr},
    {"html", "one self-contained page with plots, docs/html.md",
     report::writeHtml, nullptr},
};

struct Options {
  InputOptions Input;
  std::string Format = "text";
  std::string Output;
};

int runReport(const Options &O) {
  const Format &F = *std::find_if(
      std::begin(Formats), std::end(Formats),
      [&](const Format &X) { return O.Format == X.Name; }); // CLI11 checked it
  if (F.WriteAll) {
    report::Report R;
    if (int Status = analyzeAll(O.Input, R); Status != ExitOk)
      return Status;
    return writeOutput(O.Output, F.WriteAll(R));
  }
  OutputStream Out;
  if (int Status = Out.open(O.Output); Status != ExitOk)
    return Status;
  bool Written = true;
  int Status = analyzeEach(O.Input, [&](report::CircuitReport &&C) {
    return Written = Out.write(F.WriteOne(C));
  });
  // A failed file leaves -o FILE untouched, as the whole-report forms do;
  // stdout already holds the lines of the files before it.
  if (Status != ExitOk && Written)
    return Status;
  return Out.commit();
}

} // namespace

std::function<int()> setupReport(CLI::App &Cmd) {
  auto O = std::make_shared<Options>();
  addInputOptions(Cmd, O->Input);
  std::vector<std::string> Names;
  std::string Help = "the report's form:";
  for (const Format &F : Formats) {
    Names.push_back(F.Name);
    Help += std::string(Names.size() == 1 ? " " : ", ") + F.Name + " (" +
            F.Help + ")";
  }
  Cmd.add_option("--format", O->Format, Help)
      ->check(CLI::IsMember(Names))
      ->capture_default_str();
  Cmd.add_option("-o,--output", O->Output,
                 "write the report here instead of stdout");
  return [O] { return runReport(*O); };
}

} // namespace revbound::tool
