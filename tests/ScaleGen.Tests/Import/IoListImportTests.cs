using ApprovalTests;
using ApprovalTests.Reporters;
using ScaleGen.Emit;
using ScaleGen.Import;
using ScaleGen.Syntax;
using ScaleGen.Tests.Support;
using ScaleGen.Text;
using static ScaleGen.Tests.Import.ImportCases;

namespace ScaleGen.Tests.Import;

public class IoListImportTests
{
    // ---- The example I/O list ------------------------------------------------------------

    [Fact]
    public void Example_io_list_imports_200_points_that_check_clean_with_the_cards()
    {
        var result = IoListImporter.Import(IoListFile, File.ReadAllText(IoListFile), WithCards);

        Assert.Empty(result.Problems);
        Assert.Equal(200, result.PointCount);
        var compilation = Compilation.Compile(Cards, new SourceText("io-list.scale", result.Text!));
        Assert.Empty(compilation.Diagnostics);
        Assert.Equal(200, compilation.Plant.Points.Length);
    }

    [Fact]
    public void Example_io_list_joins_the_demo_plant_without_a_clash()
    {
        var text = IoListImporter.Import(IoListFile, File.ReadAllText(IoListFile), WithCards).Text!;
        var sources = TestInputs.ExampleFiles.Select(SourceText.FromFile).Append(new SourceText("io-list.scale", text)).ToArray();

        var compilation = Compilation.Compile(sources);

        Assert.Empty(compilation.Diagnostics);
        Assert.Equal(227, compilation.Plant.Points.Length);
    }

    [Fact]
    public void Every_build_output_can_be_made_from_the_imported_plant()
    {
        var text = IoListImporter.Import(IoListFile, File.ReadAllText(IoListFile), WithCards).Text!;
        var compilation = Compilation.Compile(Cards, new SourceText("io-list.scale", text));
        Assert.False(compilation.HasErrors);

        var context = EmitContext.From(compilation);
        foreach (var emitter in OutputCatalog.All)
        {
            var files = emitter.Emit(context).ToList();
            Assert.NotEmpty(files);
            Assert.All(files, f => Assert.False(string.IsNullOrWhiteSpace(f.Content), $"{emitter.Kind}: {f.RelativePath} is empty"));
        }
    }

    [Fact]
    public void Example_io_list_round_trips_through_the_command_line_import_build_and_verify()
    {
        using var folder = new TempFolder();
        var scale = folder.Combine("sludge.scale");
        var cards = Path.Combine(TestInputs.ExamplesFolder, "cards.scale");

        var import = TestInputs.RunCli("import", IoListFile, "--cards", cards, "-o", scale);
        Assert.Equal(0, import.ExitCode);
        var build = TestInputs.RunCli("build", cards, scale, "-o", folder.Combine("out"));
        Assert.Equal(0, build.ExitCode);
        Assert.True(File.Exists(folder.Combine("out", "plant.xml")));

        // The generated code of all 200 imported points agrees with the reference model.
        var verify = TestInputs.RunCli("verify", cards, scale, "--st", folder.Combine("out", "library.st"), folder.Combine("out", "plant.st"));
        Assert.True(verify.ExitCode == 0, verify.Out + verify.Error);
        Assert.Contains("all 200 points agree", verify.Out, StringComparison.Ordinal);
    }

    [Fact]
    public void Imported_text_is_in_canonical_layout()
    {
        var text = IoListImporter.Import(IoListFile, File.ReadAllText(IoListFile), WithCards).Text!;
        var diagnostics = new DiagnosticBag();

        var unit = SyntaxParser.Parse(new SourceText("io-list.scale", text), diagnostics);

        Assert.Empty(diagnostics);
        Assert.Equal(text, Formatter.Format(unit));
    }

    [Fact]
    public void Import_gives_the_same_text_under_a_decimal_comma_culture()
    {
        var csv = File.ReadAllText(IoListFile);
        var invariant = IoListImporter.Import(IoListFile, csv, WithCards).Text;

        var german = TestInputs.UnderCulture("de-DE", () => IoListImporter.Import(IoListFile, csv, WithCards).Text);

        Assert.Equal(invariant, german);
        Assert.Contains("range 0 .. 6.5 m", german);
    }

    [Fact]
    [UseReporter(typeof(QuietReporter))]
    public void Every_column_lands_in_its_statement()
    {
        var csv = Lines(
            "tag,description,card,address,signal_lo,signal_hi,lrv,urv,unit,sqrt,cutoff,health,hh,h,l,ll,profile,measure,shunt,on_fault,filter,tolerance,deadband,delay,hh_priority,h_priority,l_priority,ll_priority",
            "FIT-901,\"Sludge flow, line \"\"A\"\"\",ai_4_20,R9.S1.C0,4,20,0,80,m3/h,yes,2.5,ne43,76,72,8,4,flow_meter,,,hold,1,,5,15,2,,,1",
            "LT-902,Reverse-acting level (distance),ai_4_20,R9.S1.C1,,,5.5,.5,m,,,,,5,1,,level,,,low,,,5 %,60 s,,,,",
            "AIT-903,Chlorine on the 0-20 mA card,ai_0_20,R9.S2.C0,0,20,0,5,mg/L Cl2,no,,none,,4,,,analyser,,,value 0,,,2,60,,,,",
            "LDIT-904,Screen level on the voltage card,av_1_5,TH.S1.C0,4,20,0,600,mm,,,ne43,,300,,,,level,250 ohm,,+10,1%,,,,,,",
            "ZT-905,Valve position,ai_4_20,R9.S1.C2,4,20,0,100,%,,,ne43,,,,,,other,,high,,1,,,,,,");

        var result = ImportCsv(csv);

        Assert.DoesNotContain(result.Problems, p => p.IsError);
        Approvals.Verify(result.Text);
    }

    // ---- Bad cells: the message names the row and the column ---------------------------

    public static TheoryData<string, string, string, string, string> BadCells => new()
    {
        // column, cell, expected place, expected code, part of the message
        { "lrv", "abc", "io-list.csv(row 2, column G 'lrv')", "SG3004", "'abc' is not a number" },
        { "urv", "1O", "io-list.csv(row 2, column H 'urv')", "SG3004", "'1O' is not a number" },
        { "lrv", "\"0,5\"", "io-list.csv(row 2, column G 'lrv')", "SG3005", "write '0.5'" },
        { "urv", "\"1,000\"", "io-list.csv(row 2, column H 'urv')", "SG3005", "or '1000' if it separates thousands" },
        { "hh", "NaN", "io-list.csv(row 2, column M 'hh')", "SG3004", "'NaN' is not a number" },
        { "tag", "PT 901", "io-list.csv(row 2, column A 'tag')", "SG3007", "'PT 901' is not a tag" },
        { "tag", "", "io-list.csv(row 2, column A 'tag')", "SG3006", "the row has no tag" },
        { "card", "", "io-list.csv(row 2, column C 'card')", "SG3006", "the row has no card" },
        { "card", "ai-4-20", "io-list.csv(row 2, column C 'card')", "SG3007", "'ai-4-20' is not a card name" },
        { "sqrt", "maybe", "io-list.csv(row 2, column J 'sqrt')", "SG3008", "'maybe' is neither yes nor no" },
        { "health", "namur", "io-list.csv(row 2, column L 'health')", "SG3008", "'namur' is not one of ne43, none" },
        { "cutoff", "3", "io-list.csv(row 2, column K 'cutoff')", "SG3009", "needs square-root extraction" },
        { "signal_hi", "", "io-list.csv(row 2, column F 'signal_hi')", "SG3009", "signal_lo and signal_hi go together" },
        // Found by the same checks as `check`, then moved back to the cell:
        { "urv", "0", "io-list.csv(row 2, column G 'lrv')", "SG1007", "LRV and URV are both 0" },
        { "hh", "7", "io-list.csv(row 2, column M 'hh')", "SG1014", "HH (7) is below H (8)" },
        { "ll", "3", "io-list.csv(row 2, column P 'll')", "SG1014", "LL (3) is above L (2)" },
        { "card", "ai_4_21", "io-list.csv(row 2, column C 'card')", "SG1002", "did you mean 'ai_4_20'?" },
        { "signal_lo", "0", "io-list.csv(row 2, column L 'health')", "SG1018", "NAMUR NE 43 bands need a live-zero signal" },
        { "signal_lo", "25", "io-list.csv(row 2, column E 'signal_lo')", "SG1023", "the signal span must rise" },
    };

    [Theory]
    [MemberData(nameof(BadCells))]
    public void A_bad_cell_is_reported_at_its_row_and_column_and_nothing_is_made(string column, string cell, string place, string code, string message)
    {
        var result = ImportCsv(Lines(Header, WithCell(GoodRow, column, cell)));

        var error = Assert.Single(result.Problems, p => p.IsError);
        Assert.StartsWith($"{place}: error {code}: ", error.ToString());
        Assert.Contains(message, error.Message);
        Assert.Null(result.Text);
        Assert.Equal(0, result.PointCount);
    }

    [Fact]
    public void Every_bad_row_is_reported_in_row_order()
    {
        var csv = Lines(Header,
            WithCell(GoodRow, "lrv", "x"),
            WithCell(GoodRow, "tag", "PT-902"),
            WithCell(WithCell(GoodRow, "tag", "PT-903"), "h", "\"8,5\""),
            WithCell(WithCell(GoodRow, "tag", "PT-904"), "hh", "1"));

        var result = ImportCsv(csv);

        Assert.Equal(new[] { 2, 4, 5 }, result.Problems.Where(p => p.IsError).Select(p => p.SortRow));
        Assert.Null(result.Text);
    }

    [Fact]
    public void Rows_are_counted_as_a_spreadsheet_counts_them()
    {
        // Row 2 has a line break inside a quoted cell; row 3 is empty; the bad cell is on row 4.
        var csv = Lines(Header,
            "PT-901,\"Two-line\ndescription\",ai_4_20,R9.S1.C0,4,20,0,10,bar,,,ne43,,,,",
            ",,,,,,,,,,,,,,,",
            WithCell(WithCell(GoodRow, "tag", "PT-902"), "urv", "ten"));

        var error = Assert.Single(ImportCsv(csv).Problems);

        Assert.Equal("io-list.csv(row 4, column H 'urv')", error.Location);
    }

    [Fact]
    public void An_empty_line_counts_as_a_row_and_crlf_files_read_the_same()
    {
        var csv = Header + "\r\n" + GoodRow + "\r\n\r\n" + WithCell(WithCell(GoodRow, "tag", "PT-902"), "lrv", "low") + "\r\n";

        var error = Assert.Single(ImportCsv(csv).Problems);

        Assert.Equal("io-list.csv(row 4, column G 'lrv')", error.Location);
    }

    [Fact]
    public void A_tag_on_two_rows_names_the_first_row()
    {
        var error = Assert.Single(ImportCsv(Lines(Header, GoodRow, GoodRow)).Problems);

        Assert.Equal("io-list.csv(row 3, column A 'tag'): error SG3010: tag 'PT-901' is already on row 2: each point once", error.ToString());
    }

    [Fact]
    public void Tags_that_become_the_same_identifier_name_the_other_row_not_a_line_of_generated_text()
    {
        var csv = Lines(Header, WithCell(GoodRow, "tag", "PT-901"), WithCell(GoodRow, "tag", "PT_901"));

        var error = Assert.Single(ImportCsv(csv).Problems);

        Assert.Equal("SG1015", error.Code);
        Assert.StartsWith("io-list.csv(row 3, column A 'tag')", error.Location);
        Assert.Contains("(at row 2)", error.Message);
    }

    [Fact]
    public void A_missing_required_column_is_reported_on_the_header_row()
    {
        var csv = Lines(Header.Replace(",lrv,", ",low,"), GoodRow);

        var result = ImportCsv(csv);

        var error = Assert.Single(result.Problems, p => p.IsError);
        Assert.Equal("SG3002", error.Code);
        Assert.Equal("io-list.csv(row 1)", error.Location);
        Assert.Contains("no column 'lrv'", error.Message);
        Assert.Null(result.Text);
        // The stray header is reported too, with a hint.
        Assert.Contains(result.Problems, p => p.Code == "SG3101" && p.Location == "io-list.csv(row 1, column G 'low')");
    }

    [Fact]
    public void Two_headers_for_one_column_are_an_error()
    {
        var error = Assert.Single(ImportCsv(Lines(Header + ",LRV", GoodRow + ",1")).Problems);

        Assert.Equal("io-list.csv(row 1, column Q 'LRV'): error SG3003: column G 'lrv' already holds 'lrv': keep one of the two or map one to another column", error.ToString());
    }

    [Fact]
    public void A_stray_quote_in_a_field_is_reported_on_its_row()
    {
        var csv = Lines(Header, GoodRow, WithCell(WithCell(GoodRow, "tag", "PT-902"), "description", "12\" pipe"));

        var result = ImportCsv(csv);

        Assert.Contains(result.Problems, p => p.Code == "SG3001" && p.Location == "io-list.csv(row 3)");
        Assert.Null(result.Text);
    }

    [Theory]
    [InlineData("Sludge \uFFFD flow", "U+FFFD")]
    [InlineData("Zero\u200Bwidth", "U+200B")]
    [InlineData("Pump \U0001F600", "U+D83D")]
    public void A_character_the_language_cannot_hold_is_reported_at_its_cell(string description, string named)
    {
        var error = Assert.Single(ImportCsv(Lines(Header, WithCell(GoodRow, "description", description))).Problems);

        Assert.Equal("io-list.csv(row 2, column B 'description')", error.Location);
        Assert.Contains(named, error.Message);
    }

    [Fact]
    public void A_file_with_only_a_header_is_an_error()
    {
        var error = Assert.Single(ImportCsv(Lines(Header)).Problems);
        Assert.Equal("SG3011", error.Code);
    }

    // ---- Reading cells ------------------------------------------------------------------

    [Fact]
    public void Headers_match_ignoring_case_spaces_and_hyphens()
    {
        var header = " TAG ,Description,Card,Address,Signal Lo,signal-hi,LRV,URV,Unit,SQRT,Cutoff,Health,HH,H,L,LL";

        var result = ImportCsv(Lines(header, GoodRow));

        Assert.Empty(result.Problems);
        Assert.Contains("signal 4 .. 20 mA", result.Text);
    }

    [Fact]
    public void Other_header_names_are_mapped_by_option_or_file()
    {
        var csv = Lines("Tag No.,Service,Card,Channel,Lower Range,Upper Range,Units,\"Alarm, high\",Health",
            "PT-901,Test pressure,ai_4_20,R9.S1.C0,0,10,bar,8,ne43");
        var map = new HeaderMap();
        Assert.Null(map.AddSpecs(new[] { "Tag No.=tag, service=description", "Channel=address,Lower Range=lrv,Upper Range=urv,units=unit" }));
        Assert.Null(map.AddFile("map.csv", "header,column\n# a header with a comma needs the file\n\"Alarm, high\",h\n"));

        var result = ImportCsv(csv, WithCards with { Map = map });

        Assert.Empty(result.Problems);
        Assert.Contains("card ai_4_20 at \"R9.S1.C0\"", result.Text);
        Assert.Contains("range 0 .. 10 bar", result.Text);
        Assert.Contains("alarm H 8", result.Text);
    }

    [Fact]
    public void A_mapping_to_an_unknown_column_is_refused()
    {
        Assert.Equal("--map entry 'Lower=lvr': 'lvr' is not an import column: did you mean 'lrv'?", new HeaderMap().AddSpecs(new[] { "Lower=lvr" }));
        Assert.StartsWith("mapping file 'm.csv' row 2:", new HeaderMap().AddFile("m.csv", "header,column\nLower,nothing\n"));
    }

    [Fact]
    public void Quoted_fields_keep_their_commas_and_quotes()
    {
        var row = WithCell(GoodRow, "description", "\"Pump 1, \"\"duty\"\" discharge\"");

        var text = ImportCsv(Lines(Header, row)).Text!;

        Assert.Contains("desc \"Pump 1, \\\"duty\\\" discharge\"", text);
        var compilation = Compilation.Compile(Cards, new SourceText("t.scale", text));
        Assert.Equal("Pump 1, \"duty\" discharge", compilation.Plant.Points.Single().Description);
    }

    [Fact]
    public void A_semicolon_file_is_read_with_the_delimiter_option()
    {
        var csv = Lines(Header.Replace(',', ';'), GoodRow.Replace(',', ';'));

        var result = ImportCsv(csv, WithCards with { Delimiter = ";" });

        Assert.Empty(result.Problems);
        Assert.Equal(1, result.PointCount);
    }

    [Theory]
    [InlineData("+5", "5")]
    [InlineData(".5", "0.5")]
    [InlineData("5.", "5")]
    [InlineData("-0.25", "-0.25")]
    [InlineData("1E3", "1e3")]
    [InlineData(" 7.50 ", "7.50")]
    public void Numbers_are_written_as_the_language_spells_them(string cell, string written)
    {
        var onlyH = WithCell(WithCell(WithCell(GoodRow, "hh", ""), "l", ""), "ll", "");

        var text = ImportCsv(Lines(Header, WithCell(onlyH, "h", cell))).Text;

        Assert.Contains($"alarm H {written}\n", text);
    }

    [Fact]
    public void A_unit_with_a_space_is_quoted()
    {
        var text = ImportCsv(Lines(Header, WithCell(GoodRow, "unit", "mg/L Cl2"))).Text!;

        Assert.Contains("range 0 .. 10 \"mg/L Cl2\"", text);
        Assert.Equal("mg/L Cl2", Compilation.Compile(Cards, new SourceText("t.scale", text)).Plant.Points.Single().Unit);
    }

    [Fact]
    public void Without_declarations_card_names_are_not_judged()
    {
        var csv = Lines(Header, WithCell(GoodRow, "card", "card_declared_elsewhere"));

        var result = ImportCsv(csv, ImportOptions.Default);

        Assert.Empty(result.Problems);
        Assert.Contains("card card_declared_elsewhere at", result.Text);
    }

    [Fact]
    public void An_ignored_column_is_a_warning_and_the_import_goes_on()
    {
        var result = ImportCsv(Lines(Header + ",Loop Drawing", GoodRow + ",LD-0901"));

        var warning = Assert.Single(result.Problems);
        Assert.Equal("io-list.csv(row 1, column Q 'Loop Drawing'): warning SG3101: 'Loop Drawing' is not an import column, so the column is ignored; map it with --map \"Loop Drawing=COLUMN\" if it holds one", warning.ToString());
        Assert.NotNull(result.Text);
    }

    [Fact]
    public void A_warning_of_the_check_is_moved_to_its_cell()
    {
        // A setpoint outside the range is allowed but worth a look.
        var result = ImportCsv(Lines(Header, WithCell(GoodRow, "hh", "12")));

        var warning = Assert.Single(result.Problems);
        Assert.Equal("io-list.csv(row 2, column M 'hh')", warning.Location);
        Assert.Equal("SG2001", warning.Code);
        Assert.NotNull(result.Text);
    }

    [Fact]
    public void Every_column_is_described_in_the_import_docs()
    {
        var docs = File.ReadAllText(Path.Combine(TestInputs.RepositoryRoot, "docs", "import.md"));

        Assert.All(IoListColumns.All, column => Assert.Contains($"`{column.Name}`", docs));
    }

    [Theory]
    [InlineData(0, "A")]
    [InlineData(6, "G")]
    [InlineData(25, "Z")]
    [InlineData(26, "AA")]
    [InlineData(27, "AB")]
    [InlineData(701, "ZZ")]
    [InlineData(702, "AAA")]
    public void Columns_are_lettered_as_spreadsheets_letter_them(int index, string letters) =>
        Assert.Equal(letters, CsvPosition.ColumnLetter(index));

    /// <summary>The row with one cell replaced; the cell is written as given (quote it yourself if needed).</summary>
    internal static string WithCell(string row, string column, string cell)
    {
        var index = Array.IndexOf(Header.Split(','), column);
        Assert.True(index >= 0, $"no column {column}");
        var cells = SplitSimple(row);
        cells[index] = cell;
        return string.Join(",", cells);
    }

    // The rows above have no quoted commas until WithCell puts one in, and it is applied last.
    private static List<string> SplitSimple(string row)
    {
        var cells = new List<string>();
        var current = new System.Text.StringBuilder();
        var quoted = false;
        foreach (var c in row)
        {
            if (c == '"') quoted = !quoted;
            if (c == ',' && !quoted)
            {
                cells.Add(current.ToString());
                current.Clear();
            }
            else current.Append(c);
        }
        cells.Add(current.ToString());
        return cells;
    }
}
