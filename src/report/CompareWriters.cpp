//===- CompareWriters.cpp - `revbound compare` as text, Markdown, CSV, JSON ===//
#include "revbound/report/Compare.h"

#include "TableFormat.h"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

namespace revbound::report {
namespace {

using Json = nlohmann::ordered_json;
using semantics::EquivalenceResult;
using semantics::EquivalenceVerdict;
using semantics::RegisterBits;

std::string showBits(const RegisterBits &Bits) {
  std::vector<std::string> Parts;
  for (const auto &[Reg, Value] : Bits)
    Parts.push_back(Reg + "=" + Value);
  return Parts.empty() ? "(no inputs)" : fmt::format("{}", fmt::join(Parts, " "));
}

std::string showWitness(const semantics::EquivalenceWitness &W) {
  if (!W.Second)
    return fmt::format("input {}", showBits(W.First));
  return fmt::format("input (|{}> + {}|{}>)/sqrt2", showBits(W.First),
                     W.Phase == "1" ? "" : W.Phase, showBits(*W.Second));
}

const char *verdictWords(EquivalenceVerdict V) {
  switch (V) {
  case EquivalenceVerdict::Equivalent:
    return "equivalent";
  case EquivalenceVerdict::NotEquivalent:
    return "NOT equivalent";
  case EquivalenceVerdict::Unknown:
    return "undecided";
  }
  return "undecided";
}

std::string cleanWords(const std::optional<bool> &Clean) {
  if (!Clean)
    return "not decided";
  return *Clean ? "clean" : "dirty";
}

/// The lines of one verdict, for text and Markdown alike.
std::vector<std::string> verdictLines(const EquivalenceEntry &E) {
  const EquivalenceResult &R = E.Result;
  std::vector<std::string> Lines;
  Lines.push_back(fmt::format("{}: {} (method {}): {}", E.Candidate,
                              verdictWords(R.Verdict),
                              semantics::equivalenceMethodName(R.Method),
                              R.Reason));
  if (R.Witness) {
    std::string Line = "witness: " + showWitness(*R.Witness);
    if (!R.Witness->DifferingWires.empty())
      Line += fmt::format("; differs on {}",
                          fmt::join(R.Witness->DifferingWires, ", "));
    Lines.push_back(Line);
  }
  if (R.AncillasCleanA || R.AncillasCleanB)
    Lines.push_back(fmt::format("ancillas: reference {}, candidate {}",
                                cleanWords(R.AncillasCleanA),
                                cleanWords(R.AncillasCleanB)));
  for (const std::string &N : R.Notes)
    Lines.push_back("note: " + N);
  return Lines;
}

/// A cell of the comparison: the value, its delta when nonzero, and a
/// star (text) or bold (Markdown) when it is the row's least.
std::string compareCell(const MetricRow &Row, size_t I, bool Markdown) {
  if (!Row.Values[I])
    return "n/a";
  std::string V = showMetric(Row.Values[I]);
  const std::optional<MetricDelta> &D = Row.Deltas[I];
  bool Zero = D && (D->IsCount ? D->CountMagnitude == 0 : D->Real == 0);
  if (I > 0 && D && !Zero)
    V += " " + showDelta(D, true);
  if (Row.Best[I])
    V = Markdown ? "**" + V + "**" : V + " *";
  return V;
}

/// Rows with no figure for any circuit (times without an energy) are left
/// out of the tables for people.
bool anyValue(const MetricRow &Row) {
  for (const std::optional<MetricValue> &V : Row.Values)
    if (V)
      return true;
  return false;
}

Json valueJson(const std::optional<MetricValue> &V) {
  if (!V)
    return nullptr;
  if (V->IsCount)
    return V->Count;
  return V->Real;
}

Json bitsJson(const RegisterBits &Bits) {
  Json J = Json::object();
  for (const auto &[Reg, Value] : Bits)
    J[Reg] = Value;
  return J;
}

Json cleanJson(const std::optional<bool> &Clean) {
  if (!Clean)
    return nullptr;
  return *Clean;
}

Json verdictJson(const EquivalenceEntry &E) {
  const EquivalenceResult &R = E.Result;
  Json J = Json::object();
  J["candidate"] = E.Candidate;
  J["verdict"] = semantics::equivalenceVerdictName(R.Verdict);
  J["method"] = semantics::equivalenceMethodName(R.Method);
  J["reason"] = R.Reason;
  if (R.Witness) {
    Json W = Json::object();
    W["input"] = bitsJson(R.Witness->First);
    if (R.Witness->Second) {
      W["plus"] = bitsJson(*R.Witness->Second);
      W["phase"] = R.Witness->Phase;
    }
    W["differing_wires"] = R.Witness->DifferingWires;
    J["witness"] = W;
  } else {
    J["witness"] = nullptr;
  }
  if (R.Method == semantics::EquivalenceMethod::Random) {
    J["trials"] = R.Trials;
    J["miss_chance"] = {{"differing_fraction", R.StatedFraction},
                        {"at_most", R.MissChance}};
  }
  J["ancillas_clean"] = {{"reference", cleanJson(R.AncillasCleanA)},
                         {"candidate", cleanJson(R.AncillasCleanB)}};
  J["notes"] = R.Notes;
  return J;
}

std::vector<std::string> fileNames(const CompareReport &R) {
  std::vector<std::string> Names;
  for (const CircuitReport &C : R.Circuits.Circuits)
    Names.push_back(C.File);
  return Names;
}

} // namespace

std::string writeCompareText(const CompareReport &R) {
  std::vector<std::string> Files = fileNames(R);
  std::string Out;
  if (!Files.empty())
    Out += fmt::format("reference: {}\n", Files[0]);
  if (R.EquivalenceChecked) {
    Out += "\nequivalence with the reference:\n";
    for (const EquivalenceEntry &E : R.Equivalence) {
      std::vector<std::string> Lines = verdictLines(E);
      for (size_t I = 0; I < Lines.size(); ++I)
        Out += (I ? "    " : "  ") + Lines[I] + "\n";
    }
  }
  std::vector<std::vector<std::string>> Table;
  std::vector<std::string> Header = {"metric", "unit"};
  Header.insert(Header.end(), Files.begin(), Files.end());
  Table.push_back(Header);
  for (const MetricRow &Row : R.Rows) {
    if (!anyValue(Row))
      continue;
    std::vector<std::string> Cells = {Row.Label, Row.Unit};
    for (size_t I = 0; I < Files.size(); ++I)
      Cells.push_back(compareCell(Row, I, false));
    Table.push_back(std::move(Cells));
  }
  Out += "\n" + table::alignedColumns(Table);
  Out += "\n* marks the least value of a row; changes are against the "
         "reference. Physical figures are lower bounds, not predictions "
         "for any hardware.\n";
  return Out;
}

std::string writeCompareMarkdown(const CompareReport &R) {
  std::vector<std::string> Files = fileNames(R);
  std::string Out;
  if (R.EquivalenceChecked) {
    for (const EquivalenceEntry &E : R.Equivalence) {
      std::vector<std::string> Lines = verdictLines(E);
      for (size_t I = 0; I < Lines.size(); ++I)
        Out += (I ? "  - " : "- ") + table::markdownCell(Lines[I]) + "\n";
    }
    Out += "\n";
  }
  std::vector<std::string> Header = {"metric", "unit"};
  for (size_t I = 0; I < Files.size(); ++I)
    Header.push_back(I == 0 ? Files[I] + " (reference)" : Files[I]);
  Out += table::markdownRow(Header);
  Out += table::markdownRule(Header.size(), 2);
  for (const MetricRow &Row : R.Rows) {
    if (!anyValue(Row))
      continue;
    std::vector<std::string> Cells = {Row.Label, Row.Unit};
    for (size_t I = 0; I < Files.size(); ++I)
      Cells.push_back(compareCell(Row, I, true));
    Out += table::markdownRow(Cells);
  }
  Out += "\nBold marks the least value of a row; changes are against the "
         "reference. Physical figures are lower bounds, not predictions for "
         "any hardware.\n";
  return Out;
}

std::string writeCompareCsv(const CompareReport &R) {
  std::vector<std::string> Files = fileNames(R);
  std::string Out = table::csvLine(
      {"metric", "unit", "file", "value", "delta", "delta_percent", "best"});
  for (const MetricRow &Row : R.Rows)
    for (size_t I = 0; I < Files.size(); ++I) {
      const std::optional<MetricDelta> &D = Row.Deltas[I];
      Out += table::csvLine(
          {Row.Key, Row.Unit, Files[I], showMetric(Row.Values[I]),
           showDelta(D, false),
           D && D->Percent ? fmt::format("{:.6g}", *D->Percent) : "",
           Row.Best[I] ? "1" : "0"});
    }
  return Out;
}

std::string writeCompareJson(const CompareReport &R) {
  Json J;
  std::vector<std::string> Files = fileNames(R);
  J["schema"] = CompareSchemaVersion;
  J["reference"] = Files.empty() ? Json(nullptr)
                                 : Json(Files[0]);
  J["files"] = Files;
  Json Metrics = Json::array();
  for (const MetricRow &Row : R.Rows) {
    Json M;
    M["key"] = Row.Key;
    M["label"] = Row.Label;
    M["unit"] = Row.Unit;
    Json Values = Json::array();
    Json Deltas = Json::array();
    Json Best = Json::array();
    for (size_t I = 0; I < Row.Values.size(); ++I) {
      Values.push_back(valueJson(Row.Values[I]));
      const std::optional<MetricDelta> &D = Row.Deltas[I];
      if (!D) {
        Deltas.push_back(nullptr);
      } else if (D->IsCount) {
        // Exact when it fits a signed 64-bit integer, as it does for any
        // two counts below 2^63.
        if (D->CountMagnitude <= uint64_t(INT64_MAX))
          Deltas.push_back(D->Negative ? -int64_t(D->CountMagnitude)
                                       : int64_t(D->CountMagnitude));
        else
          Deltas.push_back((D->Negative ? -1.0 : 1.0) *
                           double(D->CountMagnitude));
      } else {
        Deltas.push_back(D->Real);
      }
      if (Row.Best[I])
        Best.push_back(I);
    }
    M["values"] = Values;
    M["deltas"] = Deltas;
    M["best"] = Best;
    Metrics.push_back(M);
  }
  J["metrics"] = Metrics;
  if (R.EquivalenceChecked) {
    Json E = Json::array();
    for (const EquivalenceEntry &Entry : R.Equivalence)
      E.push_back(verdictJson(Entry));
    J["equivalence"] = E;
  } else {
    J["equivalence"] = nullptr;
  }
  return J.dump(2) + "\n";
}

} // namespace revbound::report
