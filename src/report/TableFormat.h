//===- TableFormat.h - Cells for CSV and Markdown tables ------------------===//
//
// Internal to the table writers: quoting and aligned columns.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_REPORT_TABLEFORMAT_H
#define REVBOUND_REPORT_TABLEFORMAT_H

#include <algorithm>
#include <string>
#include <vector>

namespace revbound::report::table {

/// A CSV field (RFC 4180): quoted when it holds a comma, a quote or a line
/// break, with quotes doubled.
inline std::string csvField(const std::string &S) {
  if (S.find_first_of(",\"\r\n") == std::string::npos)
    return S;
  std::string Out = "\"";
  for (char C : S) {
    if (C == '"')
      Out += '"';
    Out += C;
  }
  return Out + "\"";
}

inline std::string csvLine(const std::vector<std::string> &Fields) {
  std::string Out;
  for (size_t I = 0; I < Fields.size(); ++I)
    Out += (I ? "," : "") + csvField(Fields[I]);
  return Out + "\r\n";
}

/// A Markdown table cell: pipes escaped, line breaks as spaces.
inline std::string markdownCell(const std::string &S) {
  std::string Out;
  for (char C : S) {
    if (C == '|')
      Out += "\\|";
    else if (C == '\n' || C == '\r')
      Out += ' ';
    else
      Out += C;
  }
  return Out;
}

inline std::string markdownRow(const std::vector<std::string> &Cells) {
  std::string Out = "|";
  for (const std::string &C : Cells)
    Out += " " + markdownCell(C) + " |";
  return Out + "\n";
}

/// "|---|---:|..." with the first `Left` columns left-aligned, the rest
/// (the figures) right-aligned.
inline std::string markdownRule(size_t Columns, size_t Left = 1) {
  std::string Out = "|";
  for (size_t I = 0; I < Columns; ++I)
    Out += I < Left ? "---|" : "---:|";
  return Out + "\n";
}

/// Rows of cells as text columns, the first left-aligned, the rest
/// right-aligned, two spaces apart.
inline std::string alignedColumns(const std::vector<std::vector<std::string>> &Rows) {
  std::vector<size_t> Width;
  for (const auto &R : Rows)
    for (size_t I = 0; I < R.size(); ++I) {
      if (Width.size() <= I)
        Width.push_back(0);
      Width[I] = std::max(Width[I], R[I].size());
    }
  std::string Out;
  for (const auto &R : Rows) {
    std::string Line;
    for (size_t I = 0; I < R.size(); ++I) {
      std::string Pad(Width[I] - R[I].size(), ' ');
      Line += I == 0 ? R[I] + Pad : "  " + Pad + R[I];
    }
    while (!Line.empty() && Line.back() == ' ')
      Line.pop_back();
    Out += Line + "\n";
  }
  return Out;
}

} // namespace revbound::report::table

#endif
