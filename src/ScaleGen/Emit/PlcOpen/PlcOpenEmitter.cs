using System.Globalization;
using System.Xml;
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

    public IEnumerable<GeneratedFile> Emit(EmitContext context) => [new GeneratedFile(FileName, output => Write(output, context))];

    /// <summary>The whole project as one string (for tests and small plants): UTF-8 declaration, two-space indent, '\n' line ends.</summary>
    public static string Project(EmitContext context) => TextChunks.Render(output => Write(output, context));

    /// <summary>
    /// The XML declaration, fixed: plant.xml is always written as UTF-8, also when the text
    /// goes to a writer of another encoding (<see cref="Project"/> renders into a UTF-16 string).
    /// </summary>
    private const string Declaration = "<?xml version=\"1.0\" encoding=\"utf-8\"?>\n";

    /// <summary>Documentation and ST bodies: a paragraph in the XHTML namespace, which the root element binds to this prefix.</summary>
    private const string XhtmlParagraph = "xhtml:p";

    /// <summary>
    /// The project, streamed: the plant program's declarations are written section by section
    /// as <see cref="StPlant.Program"/> makes them, so a 50,000-point file (hundreds of MB)
    /// never sits whole in memory.
    /// </summary>
    public static void Write(TextWriter output, EmitContext context)
    {
        var plant = context.Plant;
        var header = GeneratedHeader.Lines(context,
            "ScaleGen PLCopen TC6 XML project: types, function blocks and the plant program for 4-20 mA analog input points.");
        var comment = header.Append(
            $"fileHeader creationDateTime is fixed at {CreationDateTime}: the schema requires one, and ScaleGen writes no timestamps, so the same input gives the same bytes.");
        var program = StPlant.Program(plant);

        output.Write(Declaration);
        var xml = new IndentedXmlWriter(output);
        xml.WriteComment("\n" + string.Concat(comment.Select(line => "  " + XmlSafeText.CommentLine(line) + "\n")));
        // Every element below without a prefix is in the TC6 namespace, the default one here.
        xml.WriteStartElement("project");
        xml.WriteAttributeString("xmlns:xhtml", Xhtml.NamespaceName);
        xml.WriteAttributeString("xmlns", Tc6.NamespaceName);

        xml.WriteStartElement("fileHeader");
        xml.WriteAttributeString("companyName", "ScaleGen");
        xml.WriteAttributeString("productName", "scalegen");
        xml.WriteAttributeString("productVersion", XmlSafeText.Line(context.ToolVersion));
        xml.WriteAttributeString("creationDateTime", CreationDateTime);
        xml.WriteAttributeString("contentDescription", XmlSafeText.Line(header[0]));
        xml.WriteEndElement();

        xml.WriteStartElement("contentHeader");
        xml.WriteAttributeString("name", XmlSafeText.Line(plant.Title ?? "ScaleGen plant"));
        xml.WriteAttributeString("language", "en");
        TextElement(xml, "Comment", string.Join("\n", GeneratedHeader.Caution));
        xml.WriteStartElement("coordinateInfo");
        foreach (var language in (ReadOnlySpan<string>)["fbd", "ld", "sfc"]) Scaling(xml, language);
        xml.WriteEndElement();
        xml.WriteEndElement();

        xml.WriteStartElement("types");
        xml.WriteStartElement("dataTypes");
        foreach (var type in StLibrary.DataTypes) DataType(xml, type);
        xml.WriteEndElement();
        xml.WriteStartElement("pous");
        foreach (var block in StLibrary.Blocks) Pou(xml, block);
        Pou(xml, program);
        xml.WriteEndElement();
        xml.WriteEndElement();

        xml.WriteStartElement("instances");
        xml.WriteStartElement("configurations");
        Configuration(xml, plant, program);
        xml.WriteEndElement();
        xml.WriteEndElement();

        Documentation(xml, header);
        xml.WriteEndElement();
        xml.Flush();
        output.Write('\n');
    }

    /// <summary>An element in the TC6 namespace holding one text (written as &lt;name&gt;&lt;/name&gt; when empty).</summary>
    private static void TextElement(IndentedXmlWriter xml, string name, string text)
    {
        xml.WriteStartElement(name);
        xml.WriteString(text);
        xml.WriteFullEndElement();
    }

    /// <summary>The schema requires scaling for the graphical languages; 1:1, as no graphics are written.</summary>
    private static void Scaling(IndentedXmlWriter xml, string language)
    {
        xml.WriteStartElement(language);
        xml.WriteStartElement("scaling");
        xml.WriteAttributeString("x", "1");
        xml.WriteAttributeString("y", "1");
        xml.WriteEndElement();
        xml.WriteEndElement();
    }

    private static void DataType(IndentedXmlWriter xml, StDataType type)
    {
        xml.WriteStartElement("dataType");
        xml.WriteAttributeString("name", type.Name);
        xml.WriteStartElement("baseType");
        switch (type)
        {
            case StEnumType enumeration:
                xml.WriteStartElement("enum");
                xml.WriteStartElement("values");
                foreach (var value in enumeration.Values) xml.WriteEmptyElement("value", "name", value);
                xml.WriteEndElement();
                xml.WriteEndElement();
                break;
            case StStructType structure:
                xml.WriteStartElement("struct");
                foreach (var member in structure.Members) Variable(xml, member);
                xml.WriteEndElement();
                break;
            default:
                throw new ArgumentException($"No TC6 form for {type.GetType().Name}.", nameof(type));
        }
        xml.WriteEndElement();
        Documentation(xml, type.Comment);
        xml.WriteEndElement();
    }

    private static void Pou(IndentedXmlWriter xml, StPou pou)
    {
        xml.WriteStartElement("pou");
        xml.WriteAttributeString("name", pou.Name);
        xml.WriteAttributeString("pouType", pou.Kind == StPouKind.Program ? "program" : "functionBlock");
        xml.WriteStartElement("interface");
        foreach (var section in pou.Sections) Section(xml, section);
        xml.WriteEndElement();
        xml.WriteStartElement("body");
        xml.WriteStartElement("ST");
        xml.WriteStartElement(XhtmlParagraph);
        xml.WriteCData(pou.Body);
        xml.WriteFullEndElement();
        xml.WriteEndElement();
        xml.WriteEndElement();
        Documentation(xml, pou.Comment);
        xml.WriteEndElement();
    }

    private static void Section(IndentedXmlWriter xml, StVarSection section)
    {
        xml.WriteStartElement(section.Kind switch
        {
            StVarKind.Input => "inputVars",
            StVarKind.Output => "outputVars",
            _ => "localVars",
        });
        if (section.Kind == StVarKind.Constant) xml.WriteAttributeString("constant", "true");
        foreach (var variable in section.Variables) Variable(xml, variable);
        var notes = new List<string>(section.Notes);
        foreach (var variable in section.Variables)
            if (variable.Initial is { } value) AddValueNotes(notes, value, variable.Name);
        Documentation(xml, notes);
        xml.WriteEndElement();
    }

    /// <summary>The comments inside a structure value, in order; a comment after a value names the member it belongs to.</summary>
    private static void AddValueNotes(List<string> notes, StValue value, string path)
    {
        if (value is not StStructValue structure) return;
        foreach (var member in structure.Members)
        {
            notes.AddRange(member.Notes);
            if (member.Value is StStructValue) AddValueNotes(notes, member.Value, path + "." + member.Member);
            if (member.Note is { } after) notes.Add(path + "." + member.Member + ": " + after);
        }
    }

    private static void Variable(IndentedXmlWriter xml, StVariable variable)
    {
        xml.WriteStartElement("variable");
        xml.WriteAttributeString("name", variable.Name);
        xml.WriteStartElement("type");
        Type(xml, variable.Type);
        xml.WriteEndElement();
        if (variable.Initial is { } initial)
        {
            xml.WriteStartElement("initialValue");
            Value(xml, initial);
            xml.WriteEndElement();
        }
        if (variable.Comment is { } comment) Documentation(xml, [comment]);
        xml.WriteEndElement();
    }

    private static void Type(IndentedXmlWriter xml, StType type)
    {
        switch (type)
        {
            case StElementaryType elementary:
                // A name from a record, not from this file: XmlWriter checked it; so does this.
                xml.WriteStartElement(XmlConvert.VerifyNCName(elementary.Name));
                xml.WriteEndElement();
                break;
            case StStringType text:
                xml.WriteEmptyElement("string", "length", text.Length.ToString(CultureInfo.InvariantCulture));
                break;
            case StDerivedType derived:
                xml.WriteEmptyElement("derived", "name", derived.Name);
                break;
            default:
                throw new ArgumentException($"No TC6 form for {type.GetType().Name}.", nameof(type));
        }
    }

    /// <summary>A simple value keeps its Structured Text literal (a string with its quotes and $ escapes).</summary>
    private static void Value(IndentedXmlWriter xml, StValue value)
    {
        switch (value)
        {
            case StSimpleValue simple:
                xml.WriteEmptyElement("simpleValue", "value", simple.Literal);
                break;
            case StStructValue structure:
                xml.WriteStartElement("structValue");
                for (var i = 0; i < structure.Members.Count; i++)
                {
                    var member = structure.Members[i];
                    xml.WriteStartElement("value");
                    xml.WriteAttributeString("member", member.Member);
                    Value(xml, member.Value);
                    xml.WriteEndElement();
                }
                xml.WriteEndElement();
                break;
            default:
                throw new ArgumentException($"No TC6 form for {value.GetType().Name}.", nameof(value));
        }
    }

    private static void Configuration(IndentedXmlWriter xml, Plant plant, StPou program)
    {
        xml.WriteStartElement("configuration");
        xml.WriteAttributeString("name", PlcOpenNames.Configuration);
        xml.WriteStartElement("resource");
        xml.WriteAttributeString("name", Resource);
        xml.WriteStartElement("task");
        xml.WriteAttributeString("name", PlcOpenNames.Task);
        xml.WriteAttributeString("interval", StLiterals.TimeOfScans(1, plant.CycleSeconds));
        xml.WriteAttributeString("priority", TaskPriority.ToString(CultureInfo.InvariantCulture));
        xml.WriteStartElement("pouInstance");
        xml.WriteAttributeString("name", ProgramInstance);
        xml.WriteAttributeString("typeName", program.Name);
        xml.WriteEndElement();
        Documentation(xml,
        [
            "The plant's cycle: the filter constants and the delays assume it.",
            $"Priority {TaskPriority} is a placeholder: set it to the controller's task plan.",
        ]);
        xml.WriteEndElement();
        xml.WriteEndElement();
        xml.WriteEndElement();
    }

    /// <summary>
    /// A documentation element, one XHTML paragraph with a line per entry, or nothing when
    /// there are no lines. <see cref="PlcOpenReader"/> reads the lines back.
    /// </summary>
    private static void Documentation(IndentedXmlWriter xml, IReadOnlyList<string> lines)
    {
        if (lines.Count == 0) return;
        xml.WriteStartElement("documentation");
        xml.WriteStartElement(XhtmlParagraph);
        for (var i = 0; i < lines.Count; i++)
        {
            if (i > 0) xml.WriteString("\n");
            xml.WriteString(XmlSafeText.Line(lines[i]));
        }
        xml.WriteFullEndElement();
        xml.WriteEndElement();
    }
}
