using System.Text;
using System.Xml;
using System.Xml.Linq;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Model;
using static ScaleGen.Emit.PlcOpen.PlcOpenNames;

namespace ScaleGen.Emit.PlcOpen;

/// <summary>
/// `build --only plcopen`: the library and the plant program as one PLCopen TC6 XML v2.01
/// project (plant.xml), for IEC 61131-3 environments that import that exchange format.
/// </summary>
/// <remarks>
/// It writes the declarations the Structured Text emitter writes (the same
/// <see cref="StDataType"/> and <see cref="StPou"/> records from <see cref="StLibrary"/> and
/// <see cref="StPlant"/>) as XML, and the same body text inside <c>&lt;ST&gt;&lt;xhtml:p&gt;</c>.
/// Comments become <c>documentation</c> elements: a type's or POU's comment, a variable's
/// comment, and a section's notes (in the program, the point it belongs to; for a parameter
/// record, the notes that plant.st writes between its members, since a TC6 structure value
/// has no place for them). Headings between structure members have no place either and are
/// left out. Element order follows the schema's sequences.
/// </remarks>
public sealed class PlcOpenEmitter : IOutputEmitter
{
    public string Kind => "plcopen";

    public IEnumerable<GeneratedFile> Emit(EmitContext context) => [new GeneratedFile(FileName, Project(context))];

    private static readonly UTF8Encoding Utf8NoBom = new(encoderShouldEmitUTF8Identifier: false);

    /// <summary>The whole project as text: UTF-8 declaration, two-space indent, '\n' line ends.</summary>
    public static string Project(EmitContext context)
    {
        var document = Document(context);
        var settings = new XmlWriterSettings
        {
            Encoding = Utf8NoBom,
            Indent = true,
            IndentChars = "  ",
            NewLineChars = "\n",
            NewLineHandling = NewLineHandling.Replace,
        };
        using var stream = new MemoryStream();
        using (var writer = XmlWriter.Create(stream, settings))
            document.Save(writer);
        return Utf8NoBom.GetString(stream.ToArray()) + "\n";
    }

    public static XDocument Document(EmitContext context)
    {
        var plant = context.Plant;
        var header = GeneratedHeader.Lines(context,
            "ScaleGen PLCopen TC6 XML project: types, function blocks and the plant program for 4-20 mA analog input points.");
        var comment = header.Append(
            $"fileHeader creationDateTime is fixed at {CreationDateTime}: the schema requires one, and ScaleGen writes no timestamps, so the same input gives the same bytes.");
        var program = StPlant.Program(plant);

        return new XDocument(
            new XComment("\n" + string.Concat(comment.Select(line => "  " + XmlSafeText.CommentLine(line) + "\n"))),
            new XElement(Tc6 + "project",
                new XAttribute(XNamespace.Xmlns + "xhtml", Xhtml.NamespaceName),
                new XElement(Tc6 + "fileHeader",
                    new XAttribute("companyName", "ScaleGen"),
                    new XAttribute("productName", "scalegen"),
                    new XAttribute("productVersion", XmlSafeText.Line(context.ToolVersion)),
                    new XAttribute("creationDateTime", CreationDateTime),
                    new XAttribute("contentDescription", XmlSafeText.Line(header[0]))),
                new XElement(Tc6 + "contentHeader",
                    new XAttribute("name", XmlSafeText.Line(plant.Title ?? "ScaleGen plant")),
                    new XAttribute("language", "en"),
                    new XElement(Tc6 + "Comment", string.Join("\n", GeneratedHeader.Caution)),
                    new XElement(Tc6 + "coordinateInfo", Scaling("fbd"), Scaling("ld"), Scaling("sfc"))),
                new XElement(Tc6 + "types",
                    new XElement(Tc6 + "dataTypes", StLibrary.DataTypes.Select(DataType)),
                    new XElement(Tc6 + "pous", StLibrary.Blocks.Append(program).Select(Pou))),
                new XElement(Tc6 + "instances",
                    new XElement(Tc6 + "configurations", Configuration(plant, program))),
                Documentation(header)));
    }

    /// <summary>The schema requires scaling for the graphical languages; 1:1, as no graphics are written.</summary>
    private static XElement Scaling(string language) =>
        new(Tc6 + language, new XElement(Tc6 + "scaling", new XAttribute("x", "1"), new XAttribute("y", "1")));

    private static XElement DataType(StDataType type) =>
        new(Tc6 + "dataType",
            new XAttribute("name", type.Name),
            new XElement(Tc6 + "baseType", type switch
            {
                StEnumType enumeration => new XElement(Tc6 + "enum",
                    new XElement(Tc6 + "values", enumeration.Values.Select(v => new XElement(Tc6 + "value", new XAttribute("name", v))))),
                StStructType structure => new XElement(Tc6 + "struct", structure.Members.Select(Variable)),
                _ => throw new ArgumentException($"No TC6 form for {type.GetType().Name}.", nameof(type)),
            }),
            Documentation(type.Comment));

    private static XElement Pou(StPou pou) =>
        new(Tc6 + "pou",
            new XAttribute("name", pou.Name),
            new XAttribute("pouType", pou.Kind == StPouKind.Program ? "program" : "functionBlock"),
            new XElement(Tc6 + "interface", pou.Sections.Select(Section)),
            new XElement(Tc6 + "body",
                new XElement(Tc6 + "ST", new XElement(Xhtml + "p", new XCData(pou.Body)))),
            Documentation(pou.Comment));

    private static XElement Section(StVarSection section)
    {
        var element = new XElement(Tc6 + (section.Kind switch
        {
            StVarKind.Input => "inputVars",
            StVarKind.Output => "outputVars",
            _ => "localVars",
        }));
        if (section.Kind == StVarKind.Constant) element.Add(new XAttribute("constant", "true"));
        element.Add(section.Variables.Select(Variable));
        var notes = section.Notes.Concat(section.Variables.SelectMany(v => v.Initial is { } value ? ValueNotes(value, v.Name) : []));
        element.Add(Documentation(notes.ToArray()));
        return element;
    }

    /// <summary>The comments inside a structure value, in order; a comment after a value names the member it belongs to.</summary>
    private static IEnumerable<string> ValueNotes(StValue value, string path)
    {
        if (value is not StStructValue structure) yield break;
        foreach (var member in structure.Members)
        {
            var memberPath = path + "." + member.Member;
            foreach (var note in member.Notes) yield return note;
            foreach (var note in ValueNotes(member.Value, memberPath)) yield return note;
            if (member.Note is { } after) yield return memberPath + ": " + after;
        }
    }

    private static XElement Variable(StVariable variable) =>
        new(Tc6 + "variable",
            new XAttribute("name", variable.Name),
            new XElement(Tc6 + "type", Type(variable.Type)),
            variable.Initial is { } initial ? new XElement(Tc6 + "initialValue", Value(initial)) : null,
            Documentation(variable.Comment is { } comment ? [comment] : []));

    private static XElement Type(StType type) => type switch
    {
        StElementaryType elementary => new XElement(Tc6 + elementary.Name),
        StStringType text => new XElement(Tc6 + "string", new XAttribute("length", text.Length)),
        StDerivedType derived => new XElement(Tc6 + "derived", new XAttribute("name", derived.Name)),
        _ => throw new ArgumentException($"No TC6 form for {type.GetType().Name}.", nameof(type)),
    };

    /// <summary>A simple value keeps its Structured Text literal (a string with its quotes and $ escapes).</summary>
    private static XElement Value(StValue value) => value switch
    {
        StSimpleValue simple => new XElement(Tc6 + "simpleValue", new XAttribute("value", simple.Literal)),
        StStructValue structure => new XElement(Tc6 + "structValue",
            structure.Members.Select(m => new XElement(Tc6 + "value", new XAttribute("member", m.Member), Value(m.Value)))),
        _ => throw new ArgumentException($"No TC6 form for {value.GetType().Name}.", nameof(value)),
    };

    private static XElement Configuration(Plant plant, StPou program) =>
        new(Tc6 + "configuration",
            new XAttribute("name", PlcOpenNames.Configuration),
            new XElement(Tc6 + "resource",
                new XAttribute("name", Resource),
                new XElement(Tc6 + "task",
                    new XAttribute("name", PlcOpenNames.Task),
                    new XAttribute("interval", StLiterals.TimeOfScans(1, plant.CycleSeconds)),
                    new XAttribute("priority", TaskPriority),
                    new XElement(Tc6 + "pouInstance",
                        new XAttribute("name", ProgramInstance),
                        new XAttribute("typeName", program.Name)),
                    Documentation(
                    [
                        "The plant's cycle: the filter constants and the delays assume it.",
                        $"Priority {TaskPriority} is a placeholder: set it to the controller's task plan.",
                    ]))));

    /// <summary>
    /// A documentation element, one XHTML paragraph with a line per entry, or nothing when
    /// there are no lines. <see cref="PlcOpenReader"/> reads the lines back.
    /// </summary>
    internal static XElement? Documentation(IReadOnlyList<string> lines) =>
        lines.Count == 0
            ? null
            : new XElement(Tc6 + "documentation", new XElement(Xhtml + "p", string.Join("\n", lines.Select(XmlSafeText.Line))));
}
