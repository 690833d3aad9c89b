//===- RolesTest.cpp - Roles from `//!` comments and --role ---------------===//
//
// The roles and their meaning are DESIGN.md's ("Roles of wires"); the
// annotation syntax is ours (docs/formats.md). A comment keeps the file
// valid OpenQASM 2.0, since the specification (Cross et al.,
// arXiv:1707.03429, section 3) ignores everything after `//`.
//
//===----------------------------------------------------------------------===//
#include "TestSupport.h"

#include "revbound/qasm/Roles.h"

#include <gtest/gtest.h>

using revbound::ir::WireRole;
using revbound::test::elaborate;

namespace {

const char *Header = "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n";

std::vector<WireRole> rolesOf(const std::string &Body,
                              std::vector<std::string> Options = {}) {
  revbound::qasm::FrontendOptions Opts;
  for (const std::string &O : Options) {
    auto R = revbound::qasm::parseRoleOption(O);
    EXPECT_TRUE(bool(R)) << O;
    if (R)
      Opts.Roles.push_back(*R);
    else
      llvm::consumeError(R.takeError());
  }
  auto E = elaborate(std::string(Header) + Body, Opts);
  EXPECT_TRUE(E.Circuit) << E.Error;
  if (!E.Circuit)
    return {};
  std::vector<WireRole> Out;
  for (uint32_t Q = 0; Q < E.Circuit->NumQubits; ++Q)
    Out.push_back(E.Circuit->role(Q));
  return Out;
}

std::string errorOf(const std::string &Body,
                    std::vector<std::string> Options = {}) {
  revbound::qasm::FrontendOptions Opts;
  for (const std::string &O : Options)
    Opts.Roles.push_back(llvm::cantFail(revbound::qasm::parseRoleOption(O)));
  auto E = elaborate(std::string(Header) + Body, Opts);
  if (!E.Error.empty())
    return E.Error;
  return "(no error)";
}

TEST(Roles, DefaultIsOutput) {
  EXPECT_EQ(rolesOf("qreg q[2];\n"),
            (std::vector<WireRole>{WireRole::Output, WireRole::Output}));
}

TEST(Roles, AnnotationsBeforeOrAfterTheDeclaration) {
  EXPECT_EQ(rolesOf("//! input a, b\nqreg a[1];\nqreg b[2];\nqreg anc[1];\n"
                    "//!   ancilla   anc\n"),
            (std::vector<WireRole>{WireRole::Input, WireRole::Input,
                                   WireRole::Input, WireRole::Ancilla}));
}

TEST(Roles, SingleQubitsAndTheSameRoleTwice) {
  EXPECT_EQ(rolesOf("qreg q[3];\n//! garbage q[2]\n//! garbage q[2], q[0]\n"),
            (std::vector<WireRole>{WireRole::Garbage, WireRole::Output,
                                   WireRole::Garbage}));
}

TEST(Roles, OrdinaryCommentsAreNotAnnotations) {
  EXPECT_EQ(rolesOf("qreg q[1];\n// input q\n/// ancilla q\n"),
            (std::vector<WireRole>{WireRole::Output}));
}

TEST(Roles, CommandLineWinsOverTheFile) {
  EXPECT_EQ(rolesOf("qreg q[2];\n//! ancilla q\n", {"q[1]=input"}),
            (std::vector<WireRole>{WireRole::Ancilla, WireRole::Input}));
}

TEST(Roles, AnnotationLocationsAreKept) {
  auto E = elaborate(std::string(Header) + "qreg q[1];\n//! ancilla q\n");
  ASSERT_TRUE(E.Circuit);
  revbound::ResolvedLocation L =
      revbound::resolve(E.Files->mgr(), E.Circuit->roleLoc(0));
  EXPECT_EQ(L.Line, 4u);
  EXPECT_EQ(L.Column, 13u);
}

TEST(Roles, UnknownRole) {
  EXPECT_EQ(errorOf("qreg q[1];\n//! ancila q\n"),
            "test.qasm:4:5: error: unknown role 'ancila'; expected input, "
            "ancilla, output or garbage\n"
            "//! ancila q\n"
            "    ^~~~~~\n");
}

TEST(Roles, MissingRoleOrNames) {
  EXPECT_EQ(errorOf("qreg q[1];\n//!\n"),
            "test.qasm:4:1: error: expected a role (input, ancilla, output or "
            "garbage) after '//!'\n"
            "//!\n"
            "^~~\n");
  EXPECT_EQ(errorOf("qreg q[1];\n//! input\n"),
            "test.qasm:4:5: error: expected register names after 'input'\n"
            "//! input\n"
            "    ^~~~~\n");
  EXPECT_EQ(errorOf("qreg q[1];\n//! input q,\n"),
            "test.qasm:4:13: error: expected a register name or "
            "'name[index]' in a role annotation\n"
            "//! input q,\n"
            "            ^\n");
}

TEST(Roles, UndeclaredClassicalAndOutOfRange) {
  EXPECT_EQ(errorOf("qreg q[1];\n//! input r\n"),
            "test.qasm:4:11: error: 'r' is not a declared quantum register\n"
            "//! input r\n"
            "          ^\n");
  EXPECT_EQ(errorOf("qreg q[1];\ncreg c[1];\n//! input c\n"),
            "test.qasm:5:11: error: 'c' is a classical register; roles apply "
            "to qubits (bits always start at 0 and are kept)\n"
            "//! input c\n"
            "          ^\n");
  EXPECT_EQ(errorOf("qreg q[2];\n//! input q[2]\n"),
            "test.qasm:4:11: error: index 2 is out of range for 'q', which "
            "has 2 qubits\n"
            "//! input q[2]\n"
            "          ^~~~\n");
}

TEST(Roles, ConflictNamesBothPlaces) {
  EXPECT_EQ(errorOf("qreg q[2];\n//! ancilla q\n//! input q[1]\n"),
            "test.qasm:5:11: error: conflicting roles for q[1]: 'input' here, "
            "'ancilla' before\n"
            "//! input q[1]\n"
            "          ^~~~\n"
            "test.qasm:4:13: note: q[1] was declared 'ancilla' here\n"
            "//! ancilla q\n"
            "            ^\n");
}

TEST(Roles, CommandLineErrors) {
  EXPECT_EQ(errorOf("qreg q[1];\n", {"r=input"}),
            "--role r: 'r' is not a declared quantum register");
  EXPECT_EQ(errorOf("qreg q[1];\n", {"q=input", "q[0]=ancilla"}),
            "--role q[0]=ancilla: conflicting roles for q[0], which another "
            "--role made 'input'");
  EXPECT_EQ(errorOf("qreg q[1];\n", {"q[x]=input"}),
            "--role q[x]: expected a register name or 'name[index]'");
  auto Bad = revbound::qasm::parseRoleOption("q=helper");
  ASSERT_FALSE(Bad);
  EXPECT_EQ(llvm::toString(Bad.takeError()),
            "--role q=helper: expected NAME=ROLE with ROLE one of input, "
            "ancilla, output or garbage");
  auto NoEq = revbound::qasm::parseRoleOption("q");
  EXPECT_FALSE(NoEq);
  llvm::consumeError(NoEq.takeError());
}

} // namespace
