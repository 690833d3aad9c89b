//===- Roles.cpp - Roles of wires from annotations and the command line --===//
#include "revbound/qasm/Roles.h"

#include "revbound/support/Diagnostics.h"

#include "llvm/ADT/StringExtras.h"

#include <fmt/format.h>

#include <optional>
#include <variant>

namespace revbound::qasm {
namespace {

const char *const ExpectedRoles = "input, ancilla, output or garbage";

/// "name" or "name[index]", split.
struct Target {
  llvm::StringRef Name;
  std::optional<uint64_t> Index;
};

std::optional<Target> parseTarget(llvm::StringRef Text) {
  Target T;
  size_t Open = Text.find('[');
  T.Name = Text.take_front(Open).trim();
  if (T.Name.empty() || !(llvm::isAlpha(T.Name[0])) ||
      !llvm::all_of(T.Name, [](char Ch) {
        return llvm::isAlnum(Ch) || Ch == '_';
      }))
    return std::nullopt;
  if (Open == llvm::StringRef::npos)
    return T;
  llvm::StringRef Rest = Text.drop_front(Open + 1).rtrim();
  if (!Rest.consume_back("]"))
    return std::nullopt;
  uint64_t I = 0;
  if (Rest.trim().getAsInteger(10, I))
    return std::nullopt;
  T.Index = I;
  return T;
}

/// Where each qubit got its role, so that a conflict can name both places.
struct Assignment {
  std::vector<std::optional<ir::WireRole>> Role;
  std::vector<llvm::SMLoc> Loc;
};

class RoleAssigner {
public:
  explicit RoleAssigner(const ir::Circuit &C) : C(C) {
    File.Role.resize(C.NumQubits);
    File.Loc.resize(C.NumQubits);
    Command.Role.resize(C.NumQubits);
  }

  llvm::Error annotation(llvm::StringRef Text);
  llvm::Error option(const RoleOption &O);
  void apply(ir::Circuit &Out) const;

private:
  /// The qubit range a target names, or an error message.
  std::variant<std::pair<uint32_t, uint32_t>, std::string>
  resolveTarget(const Target &T) const;

  const ir::Circuit &C;
  Assignment File, Command;
};

std::variant<std::pair<uint32_t, uint32_t>, std::string>
RoleAssigner::resolveTarget(const Target &T) const {
  for (const ir::Register &R : C.QRegs) {
    if (R.Name != T.Name)
      continue;
    if (!T.Index)
      return std::make_pair(R.Offset, R.Size);
    if (*T.Index >= R.Size)
      return fmt::format("index {} is out of range for '{}', which has {} "
                         "qubit{}",
                         *T.Index, R.Name, R.Size, R.Size == 1 ? "" : "s");
    return std::make_pair(R.Offset + uint32_t(*T.Index), uint32_t(1));
  }
  for (const ir::Register &R : C.CRegs)
    if (R.Name == T.Name)
      return fmt::format("'{}' is a classical register; roles apply to "
                         "qubits (bits always start at 0 and are kept)",
                         R.Name);
  return fmt::format("'{}' is not a declared quantum register",
                     T.Name.str());
}

llvm::Error RoleAssigner::annotation(llvm::StringRef Text) {
  // Text is "//!" up to the end of the line.
  const char *Base = Text.data();
  auto At = [&](llvm::StringRef Part) {
    return llvm::SMLoc::getFromPointer(Part.data());
  };
  llvm::StringRef Body = Text.drop_front(3).rtrim();
  llvm::StringRef Word = Body.ltrim();
  size_t WordEnd = Word.find_first_of(" \t");
  llvm::StringRef RoleWord = Word.take_front(WordEnd);
  if (RoleWord.empty())
    return errorAt(llvm::SMLoc::getFromPointer(Base),
                   fmt::format("expected a role ({}) after '//!'",
                               ExpectedRoles),
                   3);
  std::optional<ir::WireRole> Role = ir::parseWireRole(RoleWord);
  if (!Role)
    return errorAt(At(RoleWord),
                   fmt::format("unknown role '{}'; expected {}",
                               RoleWord.str(), ExpectedRoles),
                   unsigned(RoleWord.size()));
  llvm::StringRef List = Word.drop_front(RoleWord.size());
  if (List.trim().empty())
    return errorAt(At(RoleWord),
                   fmt::format("expected register names after '{}'",
                               RoleWord.str()),
                   unsigned(RoleWord.size()));
  while (true) {
    size_t Comma = List.find(',');
    llvm::StringRef Item = List.take_front(Comma);
    llvm::StringRef Trimmed = Item.trim();
    llvm::StringRef Where = Trimmed.empty() ? Item : Trimmed;
    std::optional<Target> T = parseTarget(Trimmed);
    if (!T)
      return errorAt(At(Where),
                     "expected a register name or 'name[index]' in a role "
                     "annotation",
                     unsigned(Trimmed.size()));
    auto Range = resolveTarget(*T);
    if (auto *Message = std::get_if<std::string>(&Range))
      return errorAt(At(Trimmed), *Message, unsigned(Trimmed.size()));
    auto [First, Count] = std::get<std::pair<uint32_t, uint32_t>>(Range);
    for (uint32_t Q = First; Q < First + Count; ++Q) {
      if (File.Role[Q] && *File.Role[Q] != *Role) {
        Diagnostic D;
        D.Loc = At(Trimmed);
        D.Length = unsigned(Trimmed.size());
        D.Message = fmt::format("conflicting roles for {}: '{}' here, '{}' "
                                "before",
                                C.qubitName(Q), ir::wireRoleName(*Role),
                                ir::wireRoleName(*File.Role[Q]));
        Diagnostic Note;
        Note.Sev = Severity::Note;
        Note.Loc = File.Loc[Q];
        Note.Message = fmt::format("{} was declared '{}' here",
                                   C.qubitName(Q),
                                   ir::wireRoleName(*File.Role[Q]));
        D.Notes.push_back(std::move(Note));
        return llvm::make_error<DiagnosticError>(std::move(D));
      }
      File.Role[Q] = *Role;
      File.Loc[Q] = At(Trimmed);
    }
    if (Comma == llvm::StringRef::npos)
      return llvm::Error::success();
    List = List.drop_front(Comma + 1);
  }
}

llvm::Error RoleAssigner::option(const RoleOption &O) {
  std::optional<Target> T = parseTarget(O.Target);
  if (!T)
    return llvm::createStringError(
        llvm::inconvertibleErrorCode(),
        "--role %s: expected a register name or 'name[index]'",
        O.Target.c_str());
  auto Range = resolveTarget(*T);
  if (auto *Message = std::get_if<std::string>(&Range))
    return llvm::createStringError(llvm::inconvertibleErrorCode(),
                                   "--role %s: %s", O.Target.c_str(),
                                   Message->c_str());
  auto [First, Count] = std::get<std::pair<uint32_t, uint32_t>>(Range);
  for (uint32_t Q = First; Q < First + Count; ++Q) {
    if (Command.Role[Q] && *Command.Role[Q] != O.Role)
      return llvm::createStringError(
          llvm::inconvertibleErrorCode(),
          "--role %s=%s: conflicting roles for %s, which another --role "
          "made '%s'",
          O.Target.c_str(), ir::wireRoleName(O.Role), C.qubitName(Q).c_str(),
          ir::wireRoleName(*Command.Role[Q]));
    Command.Role[Q] = O.Role;
  }
  return llvm::Error::success();
}

void RoleAssigner::apply(ir::Circuit &Out) const {
  Out.QubitRoles.assign(C.NumQubits, ir::WireRole::Output);
  Out.QubitRoleLocs.assign(C.NumQubits, llvm::SMLoc());
  for (uint32_t Q = 0; Q < C.NumQubits; ++Q) {
    if (Command.Role[Q]) {
      Out.QubitRoles[Q] = *Command.Role[Q];
    } else if (File.Role[Q]) {
      Out.QubitRoles[Q] = *File.Role[Q];
      Out.QubitRoleLocs[Q] = File.Loc[Q];
    }
  }
}

} // namespace

llvm::Expected<RoleOption> parseRoleOption(llvm::StringRef Text) {
  auto [Name, RoleText] = Text.split('=');
  std::optional<ir::WireRole> Role = ir::parseWireRole(RoleText.trim());
  if (Name.trim().empty() || !Text.contains('=') || !Role)
    return llvm::createStringError(
        llvm::inconvertibleErrorCode(),
        "--role %s: expected NAME=ROLE with ROLE one of %s",
        Text.str().c_str(), ExpectedRoles);
  return RoleOption{Name.trim().str(), *Role};
}

llvm::Error assignRoles(ir::Circuit &C,
                        llvm::ArrayRef<llvm::StringRef> Annotations,
                        llvm::ArrayRef<RoleOption> Options) {
  if (Annotations.empty() && Options.empty())
    return llvm::Error::success(); // every qubit an output, no storage
  RoleAssigner A(C);
  for (llvm::StringRef Text : Annotations)
    if (llvm::Error E = A.annotation(Text))
      return E;
  for (const RoleOption &O : Options)
    if (llvm::Error E = A.option(O))
      return E;
  A.apply(C);
  return llvm::Error::success();
}

} // namespace revbound::qasm
