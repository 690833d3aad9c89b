//===- HtmlSample.cpp - Writes the HTML page of some files, for render checks
//=//
//
// Usage: revbound_html_sample OUT.html FILE.qasm... Analyses the files with
// an energy, a per-qubit energy, a target time and device durations, so that
// every part of the page appears, and writes writeHtml's page to OUT.html.
// tests/html/render_check.sh renders that page in a headless browser.
//
//===----------------------------------------------------------------------===//
#include "revbound/report/HtmlWriter.h"
#include "revbound/support/Constants.h"

#include <fstream>
#include <iostream>

using namespace revbound;

int main(int Argc, char **Argv) {
  if (Argc < 3) {
    std::cerr << "usage: revbound_html_sample OUT.html FILE.qasm...\n";
    return 2;
  }
  report::AnalysisOptions Opts;
  Opts.Energy.EnergyJ = si::ElectronvoltJoules;
  Opts.Energy.EnergyPerQubitJ = 0.1 * si::ElectronvoltJoules;
  Opts.Energy.TargetTimeS = 1e-12;
  config::Durations D;
  D.DefaultSeconds = 50e-9;
  D.Seconds["cx"] = 300e-9;
  D.Seconds["measure"] = 1e-6;
  D.Seconds["reset"] = 1e-6;
  Opts.Durations = D;
  report::Report R;
  for (int I = 2; I < Argc; ++I) {
    SourceFiles Files;
    DiagnosticSink Warnings;
    llvm::Expected<report::CircuitReport> C =
        report::analyzeFile(Files, Argv[I], {}, Opts, Warnings);
    if (!C) {
      std::cerr << Argv[I] << ": " << llvm::toString(C.takeError()) << "\n";
      return 2;
    }
    R.Circuits.push_back(std::move(*C));
  }
  std::ofstream Out(Argv[1], std::ios::binary);
  Out << report::writeHtml(R);
  return Out ? 0 : 1;
}
