namespace ScaleGen.Tests.Syntax;

/// <summary>Whole bad files, shared by the recovery test and the diagnostic snapshots. Invented data.</summary>
internal static class BadFiles
{
    /// <summary>
    /// Eleven mistakes of eleven different kinds, from the lexer to the binder, one a line
    /// (<see cref="ManyMistakesErrors"/> lists them in line order).
    /// </summary>
    public const string ManyMistakes = """
        # Recovery test: one mistake of each kind, the compiler must report them all.
        plant "Recovery test"
        cycle 0 ms
        card AI16 {
          counts 0 .. 27648 at 4 .. 20 mA
          fault-code 0x7FFF
        }
        point FT-1 {
          card AI16
          rnage 0 .. 100 m3/h
          health ne34
          alarm H 80 priority 5
        }
        point FT_1 {
          card AI61
          range 0 .. 1,5 bar
          desc "unterminated
        }
        point PT-2 {
          card AI16
          signal 0 .. 20 mA
          range 0 .. 2.5 bar
          health ne43
        }
        }

        """;

    public static readonly (string Code, int Line, int Column)[] ManyMistakesErrors =
    {
        ("SG1022", 3, 7),   // cycle 0 ms
        ("SG0013", 6, 14),  // hex fault code
        ("SG0010", 10, 3),  // rnage
        ("SG0019", 11, 10), // ne34
        ("SG1012", 12, 23), // priority 5
        ("SG1015", 14, 7),  // FT_1 collides with FT-1
        ("SG1002", 15, 8),  // AI61
        ("SG0012", 16, 15), // 1,5
        ("SG0002", 17, 8),  // unterminated string
        ("SG1018", 23, 10), // ne43 on 0 .. 20 mA
        ("SG0003", 25, 1),  // stray '}'
    };

    /// <summary>Lexical trouble and warnings whose messages print decimals (run under de-DE).</summary>
    public const string LexicalTrouble = """
        card AI16 {
          counts 0 .. 27648 at 4 .. 20 mA
          limits -4864 .. 32511 # the card still reads NE 43 failure currents
        }
        point LT-1 {
          card AI16; range NaN .. 5 m; health ne43
          desc "Level \q"
          filter 2 kg
          tolerance 0,5 %
          alarm H 4.5 deadband 5 % delay 0.05 s
        }
        point TON {
          card AI16
          range 0 .. 1 bar
          health ne43
        }
        { card AI16 }
        point FT-3 {
          card AI16
          range 0 .. 12.5 m3/h
          sqrt
          alarm L 0.5 deadband 0.1 m3/h
          measure flow
          loop {
            supply 24 V
            cable 100 m 7 mm3
          }
        """;

    /// <summary>Two files of one plant: a name declared in both, and a profile misspelt across files.</summary>
    public const string CardsFile = """
        card AI16 {
          counts 0 .. 27648 at 4 .. 20 mA
        }

        profile flow {
          measure flow
          health ne43
        }

        """;

    public const string PointsFile = """
        card AI16 {
          counts 0 .. 4000 at 1 .. 5 V
        }

        point FT-1 uses flow {
          card AI16
          range 0 .. 10 m3/h
          alarm H 9.5 deadband 0.25 m3/h
        }

        point FT-2 uses flwo {
          card AI16
          range 0 .. 10 m3/h
        }

        """;
}
