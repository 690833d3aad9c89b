//===- LexerTest.cpp - Tokens of OpenQASM 2.0 -----------------------------===//
#include "revbound/qasm/Lexer.h"

#include <gtest/gtest.h>

#include <string>
#include <vector>

using namespace revbound::qasm;

static std::vector<Tok> kinds(const std::string &Text) {
  Lexer L(Text);
  std::vector<Tok> Out;
  for (Token T = L.lex(); T.Kind != Tok::Eof; T = L.lex()) {
    Out.push_back(T.Kind);
    if (T.Kind == Tok::Error)
      break;
  }
  return Out;
}

// Checks that the statement forms of the OpenQASM 2.0 grammar (Cross et al.,
// arXiv:1707.03429, appendix) tokenize as the grammar's terminals.
TEST(Lexer, StatementTokens) {
  EXPECT_EQ(kinds("OPENQASM 2.0;"),
            (std::vector<Tok>{Tok::KwOpenqasm, Tok::Real, Tok::Semi}));
  EXPECT_EQ(kinds("measure q->c;"),
            (std::vector<Tok>{Tok::KwMeasure, Tok::Identifier, Tok::Arrow,
                              Tok::Identifier, Tok::Semi}));
  EXPECT_EQ(kinds("if(c==12) U(0,pi,-1e-5) q[0];"),
            (std::vector<Tok>{Tok::KwIf, Tok::LParen, Tok::Identifier,
                              Tok::EqEq, Tok::Integer, Tok::RParen, Tok::KwU,
                              Tok::LParen, Tok::Integer, Tok::Comma, Tok::KwPi,
                              Tok::Comma, Tok::Minus, Tok::Real, Tok::RParen,
                              Tok::Identifier, Tok::LBracket, Tok::Integer,
                              Tok::RBracket, Tok::Semi}));
}

// Checks the number forms seen in published files: "4.688447e-01",
// ".5", "1e-5" without a dot, "2." (QASMBench, vqe_uccsd_n8; common practice).
TEST(Lexer, NumberForms) {
  for (const char *Real : {"4.688447e-01", ".5", "1e-5", "2.", "3E+2", "0.0"}) {
    Lexer L(Real);
    Token T = L.lex();
    EXPECT_EQ(T.Kind, Tok::Real) << Real;
    EXPECT_EQ(T.Text, Real);
  }
  for (const char *Int : {"0", "7", "18446744073709551615"}) {
    Lexer L(Int);
    EXPECT_EQ(L.lex().Kind, Tok::Integer) << Int;
  }
}

TEST(Lexer, CommentsAndWhitespace) {
  EXPECT_EQ(kinds("// comment\r\n\tqreg // more\r\n q[1];//end"),
            (std::vector<Tok>{Tok::KwQreg, Tok::Identifier, Tok::LBracket,
                              Tok::Integer, Tok::RBracket, Tok::Semi}));
  // Valid UTF-8 in comments is fine (names of authors, arrows).
  EXPECT_EQ(kinds("// \xC3\xA9t\xC3\xA9 \xE2\x86\x92\nx"),
            (std::vector<Tok>{Tok::Identifier}));
}

TEST(Lexer, BadBytes) {
  {
    std::string Text("x\0y", 3);
    Lexer L(Text);
    L.lex();
    Token T = L.lex();
    EXPECT_EQ(T.Kind, Tok::Error);
    EXPECT_EQ(L.errorMessage(), "unexpected NUL byte");
  }
  {
    Lexer L("q\xC3\xA9");
    L.lex();
    EXPECT_EQ(L.lex().Kind, Tok::Error);
    EXPECT_EQ(L.errorMessage(), "unexpected non-ASCII byte 0xC3 outside a comment");
  }
  {
    Lexer L("// bad \xFF\xFE utf-8\n");
    EXPECT_EQ(L.lex().Kind, Tok::Error);
    EXPECT_EQ(L.errorMessage(), "comment holds invalid UTF-8 or a NUL byte");
  }
  {
    Lexer L("1e+");
    EXPECT_EQ(L.lex().Kind, Tok::Error);
    EXPECT_EQ(L.errorMessage(), "expected digits after the exponent of a number");
  }
  {
    Lexer L("a = b");
    L.lex();
    EXPECT_EQ(L.lex().Kind, Tok::Error);
    EXPECT_EQ(L.errorMessage(), "unexpected '='; did you mean '=='?");
  }
}

TEST(Lexer, Strings) {
  Lexer L("include \"qelib1.inc\";");
  EXPECT_EQ(L.lex().Kind, Tok::KwInclude);
  Token S = L.lex();
  EXPECT_EQ(S.Kind, Tok::String);
  EXPECT_EQ(S.Text, "qelib1.inc");
  Lexer Bad("include \"qelib1.inc\n");
  Bad.lex();
  EXPECT_EQ(Bad.lex().Kind, Tok::Error);
}

TEST(Lexer, TokenNamesForDiagnostics) {
  EXPECT_STREQ(tokenName(Tok::Semi), "';'");
  EXPECT_STREQ(tokenName(Tok::Eof), "end of file");
  Token T;
  T.Kind = Tok::Identifier;
  T.Text = "cx";
  EXPECT_EQ(describe(T), "identifier 'cx'");
}
