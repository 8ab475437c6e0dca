using System.Collections.Immutable;
using System.Globalization;
using System.Text;
using Microsoft.CodeAnalysis.CSharp;
using ScaleGen.Emit.StructuredText;
using ScaleGen.Text;

namespace ScaleGen.Verify;

/// <summary>The C# a set of Structured Text files translates to, with what the verifier needs to drive it.</summary>
internal sealed class StTranslation
{
    public StTranslation(string code, IReadOnlyList<SourceLocation> locations, IReadOnlyDictionary<string, StPou> pous, SourceLocation? firstLocation)
    {
        Code = code;
        Locations = locations;
        Pous = pous;
        FirstLocation = firstLocation;
    }

    /// <summary>One C# compilation unit in namespace <see cref="StTranslator.Namespace"/>.</summary>
    public string Code { get; }

    /// <summary>Positions that run-time errors refer to by index (<see cref="Runtime.StRuntimeException.Location"/>).</summary>
    public IReadOnlyList<SourceLocation> Locations { get; }

    /// <summary>Blocks and programs by name (IEC names ignore case).</summary>
    public IReadOnlyDictionary<string, StPou> Pous { get; }

    /// <summary>The start of the first file, for problems that belong to no one construct.</summary>
    public SourceLocation? FirstLocation { get; }
}

/// <summary>
/// Reads Structured Text files (the subset ScaleGen emits) and translates them to C#:
/// REAL as float and LREAL as double with every intermediate result cast back so C# never
/// computes wider; SINT, INT, DINT, USINT, UINT, UDINT as sbyte .. uint with every
/// arithmetic result range-checked; TIME in microseconds; enumerations as C# enums;
/// structures as C# structs (value semantics, as IEC assigns them); function blocks and
/// programs as classes; the standard TON on a simulated clock. Everything is type-checked
/// with IEC 61131-3 rules first; any error is an <see cref="StReadException"/> with its position.
/// </summary>
internal sealed class StTranslator
{
    public const string Namespace = "ScaleGen.Verify.Generated";
    private const string RuntimeNamespace = "ScaleGen.Verify.Runtime";
    private const int StatementsPerMethod = 64;

    private readonly Dictionary<string, StType> _types = new(StringComparer.OrdinalIgnoreCase);
    private readonly Dictionary<string, StPou> _pous = new(StringComparer.OrdinalIgnoreCase);
    private readonly Dictionary<string, List<(StType Type, StEnumMember Member)>> _enumMembers = new(StringComparer.OrdinalIgnoreCase);
    private readonly List<StTypeDeclaration> _typeDeclarations = [];
    private readonly List<SourceLocation> _locations = [];
    private int _temporaries;

    /// <summary>Variables of the block being translated that the current statement refers to.</summary>
    private HashSet<string>? _referenced;

    private const string HotPath = "[System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]";

    private StTranslator()
    {
        var ton = new StPou("TON", RuntimeNamespace + ".StTon", StPouKind.FunctionBlock, null);
        ton.Add(new StVariable("IN", "v_IN", StVarKind.Input, StTypes.Bool, null, null));
        ton.Add(new StVariable("PT", "v_PT", StVarKind.Input, StTypes.Time, null, null));
        ton.Add(new StVariable("Q", "v_Q", StVarKind.Output, StTypes.Bool, null, null));
        ton.Add(new StVariable("ET", "v_ET", StVarKind.Output, StTypes.Time, null, null));
        _pous.Add("TON", ton);
    }

    public static StTranslation Translate(IReadOnlyList<SourceText> files)
    {
        var translator = new StTranslator();
        var declarations = files.SelectMany(f => StParser.Parse(f)).ToList();
        var first = files.Count > 0 ? new SourceLocation(files[0], new TextSpan(0, 0)) : (SourceLocation?)null;
        var code = translator.Run(declarations);
        return new StTranslation(code, translator._locations, translator._pous, first);
    }

    private static StReadException Error(SourceLocation location, string message) => new(location, message);

    private static StReadException Error(StNode node, string message) => new(node.Location, message);

    private int Loc(SourceLocation location)
    {
        _locations.Add(location);
        return _locations.Count - 1;
    }

    // ---- declarations -------------------------------------------------------------------

    private string Run(List<StDeclaration> declarations)
    {
        foreach (var declaration in declarations) Declare(declaration);
        foreach (var declaration in _typeDeclarations) DefineType(declaration);
        foreach (var type in _types.Values.Where(t => t.Kind == StKind.Struct)) CheckStructCycle(type, []);
        foreach (var pou in _pous.Values.Where(p => !p.IsBuiltin)) DefineVariables(pou);
        foreach (var pou in _pous.Values.Where(p => !p.IsBuiltin)) CheckBlockCycle(pou, []);

        var code = new StringBuilder();
        code.Append("// Translated from Structured Text by scalegen verify.\n");
        code.Append("#pragma warning disable\n");
        code.Append("using System;\nusing ").Append(RuntimeNamespace).Append(";\n\n");
        code.Append("namespace ").Append(Namespace).Append("\n{\n");
        foreach (var declaration in _typeDeclarations)
        {
            var type = _types[declaration.Name];
            if (type.Kind == StKind.Enum) WriteEnum(code, type);
            else WriteStruct(code, type);
        }
        foreach (var pou in _pous.Values.Where(p => !p.IsBuiltin)) WritePou(code, pou);
        code.Append("}\n");
        return code.ToString();
    }

    private void Declare(StDeclaration declaration)
    {
        var name = declaration.Name;
        if (StTypes.IsElementaryName(name) || StTypes.OutsideSubset.Contains(name))
            throw Error(declaration, $"'{name}' is an elementary type and cannot be declared again");
        if (_types.ContainsKey(name) || _pous.ContainsKey(name))
            throw Error(declaration, $"'{name}' is declared twice (IEC 61131-3 names ignore case)");
        switch (declaration)
        {
            case StTypeDeclaration type:
                _typeDeclarations.Add(type);
                _types.Add(name, type.Spec switch
                {
                    StEnumSpec => new StType(StKind.Enum, name, "E_" + name) { Location = type.Location },
                    _ => new StType(StKind.Struct, name, "S_" + name) { Location = type.Location },
                });
                break;
            case StPouDeclaration pou:
                _pous.Add(name, new StPou(name, (pou.Kind == StPouKind.Program ? "P_" : "B_") + name, pou.Kind, pou));
                break;
        }
    }

    private void DefineType(StTypeDeclaration declaration)
    {
        var type = _types[declaration.Name];
        switch (declaration.Spec)
        {
            case StEnumSpec enumeration:
                foreach (var (member, location) in enumeration.Members)
                {
                    if (type.Members.Any(m => string.Equals(m.Name, member, StringComparison.OrdinalIgnoreCase)))
                        throw Error(location, $"'{member}' is listed twice in {type.Name}");
                    var entry = new StEnumMember(member, "m_" + member, type.Members.Count, location);
                    type.Members.Add(entry);
                    if (!_enumMembers.TryGetValue(member, out var list)) _enumMembers[member] = list = [];
                    list.Add((type, entry));
                }
                if (enumeration.Initial is { } initial)
                {
                    var index = type.Members.FindIndex(m => string.Equals(m.Name, initial.Name, StringComparison.OrdinalIgnoreCase));
                    if (index < 0) throw Error(initial.Location, $"'{initial.Name}' is not a value of {type.Name}");
                    type.InitialMember = index;
                }
                break;
            case StStructSpec structure:
                foreach (var field in structure.Fields)
                {
                    if (type.FieldIndex.ContainsKey(field.Name)) throw Error(field, $"field '{field.Name}' is declared twice in {type.Name}");
                    var fieldType = ResolveType(field.Type);
                    if (fieldType.Kind == StKind.Block) throw Error(field.Type, "a STRUCT cannot hold a function block instance");
                    var variable = new StVariable(field.Name, "f_" + field.Name, StVarKind.Local, fieldType, field.Initializer, field.Location);
                    type.Fields.Add(variable);
                    type.FieldIndex.Add(field.Name, variable);
                }
                break;
        }
    }

    private StType ResolveType(StTypeRef reference)
    {
        if (reference.Name.Equals("STRING", StringComparison.OrdinalIgnoreCase))
            return StTypes.String(reference.StringLength ?? StTypes.DefaultStringLength);
        if (StTypes.Elementary(reference.Name) is { } elementary) return elementary;
        if (StTypes.OutsideSubset.Contains(reference.Name))
            throw Error(reference, $"type {reference.Name.ToUpperInvariant()} is not in the Structured Text subset verify reads");
        if (_types.TryGetValue(reference.Name, out var type)) return type;
        if (_pous.TryGetValue(reference.Name, out var pou))
        {
            if (pou.Kind == StPouKind.Program) throw Error(reference, $"'{pou.Name}' is a PROGRAM, not a type");
            return new StType(StKind.Block, pou.Name, pou.CsName) { Pou = pou };
        }
        var hint = StNames.LibraryNames.Contains(reference.Name, StringComparer.OrdinalIgnoreCase)
            ? $" (ScaleGen declares it in {StNames.LibraryFile}: give that file too)"
            : "";
        throw Error(reference, $"unknown type '{reference.Name}'{hint}");
    }

    private void CheckStructCycle(StType type, List<StType> path)
    {
        if (path.Contains(type)) throw Error(type.Location!.Value, $"structure {type.Name} contains itself");
        path.Add(type);
        foreach (var field in type.Fields.Where(f => f.Type.Kind == StKind.Struct)) CheckStructCycle(field.Type, path);
        path.RemoveAt(path.Count - 1);
    }

    private void DefineVariables(StPou pou)
    {
        foreach (var block in pou.Syntax!.Blocks)
        {
            foreach (var declaration in block.Variables)
            {
                if (pou.VariableIndex.ContainsKey(declaration.Name))
                    throw Error(declaration, $"'{declaration.Name}' is declared twice in {pou.Name}");
                if (_types.ContainsKey(declaration.Name) || _pous.ContainsKey(declaration.Name))
                    throw Error(declaration, $"'{declaration.Name}' is already the name of a type or block");
                var type = ResolveType(declaration.Type);
                if (type.Kind == StKind.Block)
                {
                    if (block.Kind != StVarKind.Local) throw Error(declaration, "a function block instance belongs in VAR (not VAR_INPUT, VAR_OUTPUT or VAR CONSTANT)");
                    if (declaration.Initializer is not null) throw Error(declaration.Initializer, "a function block instance takes no initial value here");
                }
                pou.Add(new StVariable(declaration.Name, "v_" + declaration.Name, block.Kind, type, declaration.Initializer, declaration.Location));
            }
        }
    }

    private void CheckBlockCycle(StPou pou, List<StPou> path)
    {
        if (path.Contains(pou)) throw Error(pou.Syntax!.Location, $"function block {pou.Name} contains an instance of itself");
        path.Add(pou);
        foreach (var variable in pou.Variables.Where(v => v.Type.Kind == StKind.Block && !v.Type.Pou!.IsBuiltin)) CheckBlockCycle(variable.Type.Pou!, path);
        path.RemoveAt(path.Count - 1);
    }

    // ---- C# for types -------------------------------------------------------------------

    private static void WriteEnum(StringBuilder code, StType type)
    {
        code.Append("    public enum ").Append(type.CsName).Append(" { ")
            .AppendJoin(", ", type.Members.Select(m => m.CsName)).Append(" }\n\n");
    }

    private void WriteStruct(StringBuilder code, StType type)
    {
        code.Append("    public struct ").Append(type.CsName).Append("\n    {\n");
        foreach (var field in type.Fields)
            code.Append("        public ").Append(field.Type.CsName).Append(' ').Append(field.CsName).Append(";\n");
        // The initial value is made once and copied: blocks are reset for every case the verifier runs.
        code.Append("        private static readonly ").Append(type.CsName).Append(" __Initial = __Make();\n\n");
        code.Append("        public static ").Append(type.CsName).Append(" __Init() => __Initial;\n\n");
        code.Append("        private static ").Append(type.CsName).Append(" __Make()\n        {\n");
        code.Append("            ").Append(type.CsName).Append(" r = default;\n");
        foreach (var field in type.Fields)
            WriteInit(code, "            ", "r." + field.CsName, field.Type, field.Initializer);
        code.Append("            return r;\n        }\n    }\n\n");
    }

    /// <summary>Statements that give a target its declared initial value (or the type's default).</summary>
    private void WriteInit(StringBuilder code, string indent, string target, StType type, StInitializer? initializer)
    {
        if (type.Kind == StKind.Struct)
        {
            code.Append(indent).Append(target).Append(" = ").Append(type.CsName).Append(".__Init();\n");
            switch (initializer)
            {
                case null:
                    return;
                case StStructInitializer structure:
                    var seen = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
                    foreach (var field in structure.Fields)
                    {
                        if (!type.FieldIndex.TryGetValue(field.Name, out var member))
                            throw Error(field, $"{type.Name} has no field '{field.Name}'");
                        if (!seen.Add(field.Name)) throw Error(field, $"field '{field.Name}' is given twice");
                        WriteInit(code, indent, target + "." + member.CsName, member.Type, field.Value);
                    }
                    return;
                default:
                    throw Error(initializer, $"a {type.Name} takes a structure initial value, (Field := ..., ...)");
            }
        }
        string value;
        switch (initializer)
        {
            case null:
                value = DefaultValue(type);
                break;
            case StExpressionInitializer expression:
                value = Coerce(Bind(expression.Expression, null), type, expression.Expression.Location, "as an initial value");
                break;
            default:
                throw Error(initializer, $"{type.Display} takes a single value, not a structure initialiser");
        }
        code.Append(indent).Append(target).Append(" = ").Append(value).Append(";\n");
    }

    private static string DefaultValue(StType type) => type.Kind switch
    {
        StKind.Bool => "false",
        StKind.Real => "0f",
        StKind.Lreal => "0d",
        StKind.Time => "0L",
        StKind.String => "\"\"",
        StKind.Enum => type.CsName + "." + type.Members[type.InitialMember].CsName,
        _ when type.IsInteger => $"(({type.CsName})0)",
        _ => throw new InvalidOperationException($"no default value for {type.Display}"),
    };

    // ---- C# for blocks and programs ----------------------------------------------------------

    private void WritePou(StringBuilder code, StPou pou)
    {
        code.Append("    public sealed class ").Append(pou.CsName).Append("\n    {\n");
        code.Append("        private readonly StClock __clock;\n");
        foreach (var variable in pou.Variables)
            code.Append("        public ").Append(variable.Type.CsName).Append(' ').Append(variable.CsName).Append(";\n");

        code.Append("\n        public ").Append(pou.CsName).Append("(StClock clock)\n        {\n            __clock = clock;\n");
        foreach (var variable in pou.Variables.Where(v => v.Type.Kind == StKind.Block))
            code.Append("            ").Append(variable.CsName).Append(" = new ").Append(variable.Type.CsName).Append("(clock);\n");
        code.Append("            __Init();\n        }\n");

        // Each variable's initial value in its own method keeps methods small for the JIT
        // (a program's parameter records run to dozens of statements each).
        var initMethods = new StringBuilder();
        code.Append('\n');
        if (pou.Kind == StPouKind.FunctionBlock) code.Append("        ").Append(HotPath).Append('\n');
        code.Append("        public void __Init()\n        {\n");
        foreach (var variable in pou.Variables)
        {
            if (variable.Type.Kind == StKind.Block)
            {
                code.Append("            ").Append(variable.CsName).Append(".__Init();\n");
                continue;
            }
            var init = new StringBuilder();
            WriteInit(init, "            ", variable.CsName, variable.Type, variable.Initializer);
            if (variable.Type.Kind == StKind.Struct && variable.Initializer is not null)
            {
                code.Append("            __Init_").Append(variable.CsName).Append("();\n");
                initMethods.Append("\n        private void __Init_").Append(variable.CsName).Append("()\n        {\n").Append(init).Append("        }\n");
            }
            else code.Append(init);
        }
        code.Append("        }\n").Append(initMethods);

        var body = pou.Syntax!.Body;
        if (pou.Kind == StPouKind.Program)
        {
            // A program: one method per top-level statement, so the verifier can also run
            // the statements of one point alone, and a note of the variables each touches.
            var groups = Enumerable.Range(0, body.Length).Chunk(StatementsPerMethod).ToList();
            code.Append("\n        public void Body()\n        {\n");
            for (var g = 0; g < groups.Count; g++) code.Append("            Body_").Append(g).Append("();\n");
            code.Append("        }\n");
            for (var g = 0; g < groups.Count; g++)
            {
                code.Append("\n        ").Append(HotPath).Append("\n        private void Body_").Append(g).Append("()\n        {\n");
                foreach (var i in groups[g]) code.Append("            S_").Append(i).Append("();\n");
                code.Append("        }\n");
            }
            for (var i = 0; i < body.Length; i++)
            {
                _referenced = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
                code.Append("\n        ").Append(HotPath).Append("\n        public void S_").Append(i).Append("()\n        {\n");
                WriteStatement(code, "            ", body[i], pou);
                code.Append("        }\n");
                pou.StatementVariables.Add(_referenced);
                _referenced = null;
            }
            code.Append("    }\n\n");
            return;
        }
        var chunks = body.Chunk(StatementsPerMethod).ToList();
        code.Append("\n        ").Append(HotPath).Append("\n        public void Body()\n        {\n");
        if (chunks.Count == 1)
            foreach (var statement in chunks[0]) WriteStatement(code, "            ", statement, pou);
        else
            for (var i = 0; i < chunks.Count; i++) code.Append("            Body_").Append(i).Append("();\n");
        code.Append("        }\n");
        for (var i = 0; chunks.Count > 1 && i < chunks.Count; i++)
        {
            code.Append("\n        ").Append(HotPath).Append("\n        private void Body_").Append(i).Append("()\n        {\n");
            foreach (var statement in chunks[i]) WriteStatement(code, "            ", statement, pou);
            code.Append("        }\n");
        }
        code.Append("    }\n\n");
    }

    // ---- statements -------------------------------------------------------------------------

    private void WriteStatement(StringBuilder code, string indent, StStatement statement, StPou pou)
    {
        switch (statement)
        {
            case StEmptyStatement:
                return;
            case StAssignment assignment:
            {
                var (target, type) = BindTarget(assignment.Target, pou);
                var value = Coerce(Bind(assignment.Value, pou), type, assignment.Value.Location, $"to {Describe(assignment.Target)}");
                code.Append(indent).Append(target).Append(" = ").Append(value).Append(";\n");
                return;
            }
            case StBlockCall call:
                WriteCall(code, indent, call, pou);
                return;
            case StIf conditional:
            {
                for (var i = 0; i < conditional.Branches.Length; i++)
                {
                    var (condition, body) = conditional.Branches[i];
                    var test = Coerce(Bind(condition, pou), StTypes.Bool, condition.Location, "as a condition");
                    code.Append(indent).Append(i == 0 ? "if (" : "else if (").Append(test).Append(")\n").Append(indent).Append("{\n");
                    foreach (var inner in body) WriteStatement(code, indent + "    ", inner, pou);
                    code.Append(indent).Append("}\n");
                }
                if (conditional.Else is { } otherwise)
                {
                    code.Append(indent).Append("else\n").Append(indent).Append("{\n");
                    foreach (var inner in otherwise) WriteStatement(code, indent + "    ", inner, pou);
                    code.Append(indent).Append("}\n");
                }
                return;
            }
            default:
                throw Error(statement, "statement not in the Structured Text subset verify reads");
        }
    }

    /// <summary>
    /// <c>inst(A := x, B := y);</c> evaluates every argument first, then sets the inputs and
    /// runs the body; inputs not given keep their values (IEC 61131-3).
    /// </summary>
    private void WriteCall(StringBuilder code, string indent, StBlockCall call, StPou pou)
    {
        if (!pou.VariableIndex.TryGetValue(call.Instance, out var instance))
        {
            if (_pous.ContainsKey(call.Instance))
                throw Error(call, $"'{call.Instance}' is a function block type; call an instance of it");
            throw Error(call, $"unknown function block instance '{call.Instance}'");
        }
        if (instance.Type.Kind != StKind.Block)
            throw Error(call, $"'{instance.Name}' is a {instance.Type.Display}, not a function block instance");
        var callee = instance.Type.Pou!;
        _referenced?.Add(instance.Name);
        var seen = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        var temporaries = new List<(string Temp, StVariable Input)>();
        code.Append(indent).Append("{\n");
        foreach (var argument in call.Arguments)
        {
            if (!callee.VariableIndex.TryGetValue(argument.Name, out var input))
                throw Error(argument, $"{callee.Name} has no input '{argument.Name}'");
            if (input.Kind != StVarKind.Input)
                throw Error(argument, $"'{input.Name}' of {callee.Name} is not a VAR_INPUT; only inputs are given in a call");
            if (!seen.Add(argument.Name)) throw Error(argument, $"input '{argument.Name}' is given twice");
            var temp = "__t" + (_temporaries++).ToString(CultureInfo.InvariantCulture);
            var value = Coerce(Bind(argument.Value, pou), input.Type, argument.Value.Location, $"to input {argument.Name} of {callee.Name}");
            code.Append(indent).Append("    ").Append(input.Type.CsName).Append(' ').Append(temp).Append(" = ").Append(value).Append(";\n");
            temporaries.Add((temp, input));
        }
        foreach (var (temp, input) in temporaries)
            code.Append(indent).Append("    ").Append(instance.CsName).Append('.').Append(input.CsName).Append(" = ").Append(temp).Append(";\n");
        code.Append(indent).Append("    ").Append(instance.CsName).Append(".Body();\n");
        code.Append(indent).Append("}\n");
    }

    private static string Describe(StExpression expression) => expression switch
    {
        StNameExpression name => name.Name,
        StMemberExpression member => Describe(member.Target) + "." + member.Member,
        _ => "the target",
    };

    /// <summary>The left side of an assignment: a variable, or a chain of structure fields and block inputs from one.</summary>
    private (string Code, StType Type) BindTarget(StExpression target, StPou pou)
    {
        switch (target)
        {
            case StNameExpression name:
            {
                if (!pou.VariableIndex.TryGetValue(name.Name, out var variable))
                    throw Error(name, $"unknown variable '{name.Name}' in {pou.Name}");
                if (variable.Kind == StVarKind.Constant) throw Error(name, $"'{variable.Name}' is a constant and cannot be assigned");
                if (variable.Type.Kind == StKind.Block) throw Error(name, $"'{variable.Name}' is a function block instance and cannot be assigned");
                _referenced?.Add(variable.Name);
                return (variable.CsName, variable.Type);
            }
            case StMemberExpression member:
            {
                string code;
                StType type;
                if (member.Target is StNameExpression root && pou.VariableIndex.TryGetValue(root.Name, out var instance) && instance.Type.Kind == StKind.Block)
                {
                    // An input of an instance, set from outside its call.
                    _referenced?.Add(instance.Name);
                    (code, type) = (instance.CsName, instance.Type);
                }
                else (code, type) = BindTarget(member.Target, pou);
                if (type.Kind == StKind.Struct)
                {
                    if (!type.FieldIndex.TryGetValue(member.Member, out var field)) throw Error(member, $"{type.Name} has no field '{member.Member}'");
                    return (code + "." + field.CsName, field.Type);
                }
                if (type.Kind == StKind.Block)
                {
                    if (!type.Pou!.VariableIndex.TryGetValue(member.Member, out var input)) throw Error(member, $"{type.Name} has no member '{member.Member}'");
                    if (input.Kind != StVarKind.Input) throw Error(member, $"only inputs of an instance can be assigned from outside; '{input.Name}' is not one");
                    return (code + "." + input.CsName, input.Type);
                }
                throw Error(member, $"{type.Display} has no members");
            }
            default:
                throw Error(target, "only a variable, a field or a block input can be assigned");
        }
    }

    // ---- expressions ------------------------------------------------------------------------

    /// <summary>A typed expression: its C# code, or for an untyped literal its value, to be fixed by <see cref="Coerce"/>.</summary>
    private sealed record Bound(StType Type, string Code, long IntegerValue = 0, string? RealText = null);

    /// <summary>Binds an expression inside a block or program, or (pou null) a constant initial value.</summary>
    private Bound Bind(StExpression expression, StPou? pou)
    {
        var bound = BindAny(expression, pou);
        if (bound.Type.Kind == StKind.Block)
            throw Error(expression, $"'{Describe(expression)}' is a function block instance; use one of its outputs");
        return bound;
    }

    private Bound BindAny(StExpression expression, StPou? pou)
    {
        switch (expression)
        {
            case StIntegerLiteral integer when integer.TypeName is null:
                return new Bound(StTypes.AnyInt, "", integer.Value);
            case StIntegerLiteral integer:
            {
                var type = StTypes.Elementary(integer.TypeName!)!;
                return new Bound(type, IntegerCode(integer.Value, type, integer.Location));
            }
            case StRealLiteral real when real.TypeName is null:
                return new Bound(StTypes.AnyReal, "", RealText: real.Text);
            case StRealLiteral real:
            {
                var type = StTypes.Elementary(real.TypeName!)!;
                return new Bound(type, RealCode(real.Text, type, real.Location));
            }
            case StBoolLiteral boolean:
                return new Bound(StTypes.Bool, boolean.Value ? "true" : "false");
            case StTimeLiteral time:
                return new Bound(StTypes.Time, time.Microseconds.ToString(CultureInfo.InvariantCulture) + "L");
            case StStringLiteral text:
                return new Bound(StTypes.String(text.Value.Length), SymbolDisplay.FormatLiteral(text.Value, quote: true));
            case StEnumLiteral literal:
            {
                if (!_types.TryGetValue(literal.TypeName, out var type) || type.Kind != StKind.Enum)
                    throw Error(literal, $"'{literal.TypeName}' is not an enumeration type");
                var member = type.Members.FirstOrDefault(m => string.Equals(m.Name, literal.Member, StringComparison.OrdinalIgnoreCase))
                    ?? throw Error(literal, $"'{literal.Member}' is not a value of {type.Name}");
                return new Bound(type, type.CsName + "." + member.CsName);
            }
            case StNameExpression name:
                return BindName(name, pou);
            case StMemberExpression member:
                return BindMember(member, pou);
            case StUnaryExpression unary:
                return BindUnary(unary, pou);
            case StBinaryExpression binary:
                return BindBinary(binary, pou);
            case StCallExpression call:
                return BindCall(call, pou);
            default:
                throw Error(expression, "expression not in the Structured Text subset verify reads");
        }
    }

    private Bound BindName(StNameExpression name, StPou? pou)
    {
        if (pou is not null && pou.VariableIndex.TryGetValue(name.Name, out var variable))
        {
            _referenced?.Add(variable.Name);
            return new Bound(variable.Type, variable.CsName);
        }
        if (_enumMembers.TryGetValue(name.Name, out var candidates))
        {
            if (candidates.Count > 1)
                throw Error(name, $"'{name.Name}' is a value of more than one enumeration ({string.Join(", ", candidates.Select(c => c.Type.Name))}); write Type#{name.Name}");
            var (type, member) = candidates[0];
            return new Bound(type, type.CsName + "." + member.CsName);
        }
        if (pou is null) throw Error(name, $"an initial value must be a literal or an enumeration value; '{name.Name}' is neither");
        throw Error(name, $"unknown name '{name.Name}' in {pou.Name}");
    }

    private Bound BindMember(StMemberExpression member, StPou? pou)
    {
        var target = BindAny(member.Target, pou);
        switch (target.Type.Kind)
        {
            case StKind.Struct:
            {
                if (!target.Type.FieldIndex.TryGetValue(member.Member, out var field))
                    throw Error(member, $"{target.Type.Name} has no field '{member.Member}'");
                return new Bound(field.Type, target.Code + "." + field.CsName);
            }
            case StKind.Block:
            {
                var callee = target.Type.Pou!;
                if (!callee.VariableIndex.TryGetValue(member.Member, out var variable))
                    throw Error(member, $"{callee.Name} has no member '{member.Member}'");
                if (variable.Kind is not (StVarKind.Input or StVarKind.Output))
                    throw Error(member, $"'{variable.Name}' is internal to {callee.Name}; only its inputs and outputs can be read from outside");
                return new Bound(variable.Type, target.Code + "." + variable.CsName);
            }
            default:
                throw Error(member, $"{target.Type.Display} has no members");
        }
    }

    private Bound BindUnary(StUnaryExpression unary, StPou? pou)
    {
        var operand = Bind(unary.Operand, pou);
        if (unary.Operator == "NOT")
        {
            if (operand.Type.Kind != StKind.Bool)
                throw Error(unary, $"NOT takes a BOOL here, not {operand.Type.Display} (bit strings are not in the subset verify reads)");
            return new Bound(StTypes.Bool, $"(!{operand.Code})");
        }
        // Unary minus of anything but a literal (literals are folded by the parser).
        var type = operand.Type;
        if (type.IsUntyped) type = Concrete(operand, unary.Location);
        var code = Coerce(operand, type, unary.Location, "to '-'");
        if (type.IsReal) return new Bound(type, $"(({type.CsName})(-{code}))");
        if (type.IsInteger || type.Kind == StKind.Time)
            return new Bound(type, $"(({type.CsName})StRt.Neg({code}, {type.Min}L, {type.Max}L, {Loc(unary.Location)}, \"{type.Name}\"))");
        throw Error(unary, $"'-' needs a number, not {type.Display}");
    }

    private Bound BindBinary(StBinaryExpression binary, StPou? pou)
    {
        var left = Bind(binary.Left, pou);
        var right = Bind(binary.Right, pou);
        var op = binary.Operator;

        if (op is "AND" or "OR" or "XOR")
        {
            if (left.Type.Kind != StKind.Bool || right.Type.Kind != StKind.Bool)
                throw Error(binary, $"{op} takes BOOL operands here, not {left.Type.Display} and {right.Type.Display} (bit strings are not in the subset verify reads)");
            var symbol = op switch { "AND" => "&", "OR" => "|", _ => "^" };
            return new Bound(StTypes.Bool, $"({left.Code} {symbol} {right.Code})");
        }

        if (left.Type.IsUntyped && right.Type.IsUntyped && op is "+" or "-" or "*" or "/")
            return FoldLiterals(binary, left, right);

        var type = CommonType(left, right, binary);
        var a = Coerce(left, type, binary.Left.Location, $"to '{op}'");
        var b = Coerce(right, type, binary.Right.Location, $"to '{op}'");

        if (op is "=" or "<>" or "<" or ">" or "<=" or ">=")
        {
            var ordered = op is "<" or ">" or "<=" or ">=";
            var comparable = type.IsNumeric || type.Kind == StKind.Time || (!ordered && type.Kind is StKind.Bool or StKind.Enum or StKind.String);
            if (!comparable) throw Error(binary, $"'{op}' cannot compare {type.Display} values");
            var symbol = op switch { "=" => "==", "<>" => "!=", _ => op };
            if (type.Kind == StKind.String) return new Bound(StTypes.Bool, $"string.Equals({a}, {b}, StringComparison.Ordinal) == {(op == "=" ? "true" : "false")}");
            return new Bound(StTypes.Bool, $"({a} {symbol} {b})");
        }

        if (type.IsReal) return new Bound(type, $"(({type.CsName})({a} {op} {b}))");
        if (type.IsInteger || (type.Kind == StKind.Time && op is "+" or "-"))
        {
            var helper = op switch { "+" => "Add", "-" => "Sub", "*" => "Mul", _ => "Div" };
            return new Bound(type, $"(({type.CsName})StRt.{helper}({a}, {b}, {type.Min}L, {type.Max}L, {Loc(binary.Location)}, \"{type.Name}\"))");
        }
        throw Error(binary, $"'{op}' is not defined for {type.Display}");
    }

    /// <summary>Arithmetic on two untyped literals stays an untyped literal (so 1 + 2 can still become an INT).</summary>
    private Bound FoldLiterals(StBinaryExpression binary, Bound left, Bound right)
    {
        if (left.Type.Kind == StKind.AnyInt && right.Type.Kind == StKind.AnyInt)
        {
            Int128 a = left.IntegerValue, b = right.IntegerValue;
            if (binary.Operator == "/" && b == 0) throw Error(binary, "division by zero");
            var value = binary.Operator switch { "+" => a + b, "-" => a - b, "*" => a * b, _ => a / b };
            if (value < long.MinValue || value > long.MaxValue) throw Error(binary, "integer constant too large");
            return new Bound(StTypes.AnyInt, "", (long)value);
        }
        double x = LiteralDouble(left), y = LiteralDouble(right);
        var result = binary.Operator switch { "+" => x + y, "-" => x - y, "*" => x * y, _ => x / y };
        if (!double.IsFinite(result)) throw Error(binary, "constant expression is not a finite number");
        return new Bound(StTypes.AnyReal, "", RealText: result.ToString("R", CultureInfo.InvariantCulture));
    }

    private static double LiteralDouble(Bound literal) =>
        literal.Type.Kind == StKind.AnyInt ? literal.IntegerValue : double.Parse(literal.RealText!, NumberStyles.Float, CultureInfo.InvariantCulture);

    /// <summary>The type two operands meet in: the same type, or the one the other widens to implicitly.</summary>
    private static StType CommonType(Bound left, Bound right, StNode at)
    {
        var (a, b) = (left.Type, right.Type);
        if (a.IsUntyped && b.IsUntyped) return a.Kind == StKind.AnyReal || b.Kind == StKind.AnyReal ? StTypes.Lreal : StTypes.Dint;
        if (a.IsUntyped) return b;
        if (b.IsUntyped) return a;
        if (StTypes.Same(a, b)) return a;
        if (StTypes.Widens(a, b)) return b;
        if (StTypes.Widens(b, a)) return a;
        throw Error(at, $"{a.Display} and {b.Display} do not mix without a conversion function (IEC 61131-3 has no implicit conversion between them)");
    }

    /// <summary>An untyped literal standing alone takes DINT or LREAL.</summary>
    private static StType Concrete(Bound bound, SourceLocation at) => bound.Type.Kind switch
    {
        StKind.AnyInt => StTypes.Dint,
        StKind.AnyReal => StTypes.Lreal,
        _ => bound.Type,
    };

    /// <summary>C# for a value converted to a type: an untyped literal takes it, a type widens to it implicitly, or it is an error.</summary>
    private string Coerce(Bound bound, StType target, SourceLocation at, string context)
    {
        var source = bound.Type;
        if (source.Kind == StKind.AnyInt)
        {
            if (target.IsInteger) return IntegerCode(bound.IntegerValue, target, at);
            if (target.IsReal) return RealCode(bound.IntegerValue.ToString(CultureInfo.InvariantCulture), target, at);
            throw Error(at, $"an integer literal cannot be given {context}, which is {target.Display}");
        }
        if (source.Kind == StKind.AnyReal)
        {
            if (target.IsReal) return RealCode(bound.RealText!, target, at);
            throw Error(at, $"a REAL literal cannot be given {context}, which is {target.Display}; IEC 61131-3 converts REAL to integers only with a conversion function");
        }
        if (target.Kind == StKind.String && source.Kind == StKind.String)
        {
            if (source.StringLength > target.StringLength)
                throw Error(at, $"a STRING of up to {source.StringLength} characters does not fit {target.Display}");
            return bound.Code;
        }
        if (ReferenceEquals(source, target) || (StTypes.Same(source, target) && source.Kind is not (StKind.Enum or StKind.Struct)))
            return bound.Code;
        if (StTypes.Widens(source, target)) return $"(({target.CsName}){bound.Code})";
        throw Error(at, $"{source.Display} cannot be given {context}, which is {target.Display}, without a conversion function");
    }

    private static string IntegerCode(long value, StType type, SourceLocation at)
    {
        if (value < type.Min || value > type.Max)
            throw Error(at, $"{value} does not fit {type.Name} ({type.Min} .. {type.Max})");
        var digits = value.ToString(CultureInfo.InvariantCulture);
        return type.Kind switch
        {
            StKind.Dint => value < 0 ? $"({digits})" : digits,
            StKind.Udint => digits + "u",
            _ => $"(({type.CsName})({digits}))",
        };
    }

    /// <summary>A REAL literal becomes the float nearest its decimal text (not the float nearest the double nearest it), an LREAL the nearest double.</summary>
    private static string RealCode(string text, StType type, SourceLocation at)
    {
        if (type.Kind == StKind.Real)
        {
            var value = float.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);
            if (!float.IsFinite(value)) throw Error(at, $"{text} is beyond the REAL range");
            return "(" + value.ToString("R", CultureInfo.InvariantCulture) + "f)";
        }
        var wide = double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);
        if (!double.IsFinite(wide)) throw Error(at, $"{text} is beyond the LREAL range");
        return "(" + wide.ToString("R", CultureInfo.InvariantCulture) + "d)";
    }

    // ---- standard functions -----------------------------------------------------------------

    private Bound BindCall(StCallExpression call, StPou? pou)
    {
        var name = call.Function.ToUpperInvariant();
        var args = call.Arguments.Select(a => Bind(a, pou)).ToList();

        void Arity(int count)
        {
            if (args.Count != count) throw Error(call, $"{name} takes {count} argument{(count == 1 ? "" : "s")}, not {args.Count}");
        }

        if (args.Count > 0 && args.All(a => a.Type.IsUntyped) && FoldFunction(name, args, call) is { } folded)
            return folded;

        switch (name)
        {
            case "SQRT":
            {
                Arity(1);
                var type = args[0].Type.Kind == StKind.AnyReal ? StTypes.Lreal : args[0].Type;
                if (!type.IsReal) throw Error(call, $"SQRT takes REAL or LREAL, not {args[0].Type.Display}");
                var x = Coerce(args[0], type, call.Arguments[0].Location, "to SQRT");
                return new Bound(type, type.Kind == StKind.Real ? $"MathF.Sqrt({x})" : $"Math.Sqrt({x})");
            }
            case "ABS":
            {
                Arity(1);
                var type = Concrete(args[0], call.Location);
                var x = Coerce(args[0], type, call.Arguments[0].Location, "to ABS");
                if (type.Kind == StKind.Real) return new Bound(type, $"MathF.Abs({x})");
                if (type.Kind == StKind.Lreal) return new Bound(type, $"Math.Abs({x})");
                if (type.IsInteger) return new Bound(type, $"(({type.CsName})StRt.Abs({x}, {type.Min}L, {type.Max}L, {Loc(call.Location)}, \"{type.Name}\"))");
                throw Error(call, $"ABS takes a number, not {type.Display}");
            }
            case "MIN" or "MAX":
            {
                if (args.Count < 2) throw Error(call, $"{name} takes two or more arguments");
                var type = CommonOf(args, call);
                if (!(type.IsNumeric || type.Kind == StKind.Time)) throw Error(call, $"{name} takes numbers or TIME, not {type.Display}");
                var codes = args.Select((a, i) => Coerce(a, type, call.Arguments[i].Location, $"to {name}")).ToList();
                var math = type.Kind == StKind.Real ? "MathF" : "Math";
                var method = name == "MIN" ? "Min" : "Max";
                var result = codes[0];
                foreach (var next in codes.Skip(1)) result = $"{math}.{method}({result}, {next})";
                return new Bound(type, result);
            }
            case "LIMIT":
            {
                Arity(3);
                var type = CommonOf(args, call);
                if (!(type.IsNumeric || type.Kind == StKind.Time)) throw Error(call, $"LIMIT takes numbers or TIME, not {type.Display}");
                var mn = Coerce(args[0], type, call.Arguments[0].Location, "to LIMIT");
                var x = Coerce(args[1], type, call.Arguments[1].Location, "to LIMIT");
                var mx = Coerce(args[2], type, call.Arguments[2].Location, "to LIMIT");
                var math = type.Kind == StKind.Real ? "MathF" : "Math";
                // MIN(MAX(IN, MN), MX): defined even when MN > MX.
                return new Bound(type, $"{math}.Min({math}.Max({x}, {mn}), {mx})");
            }
            case "SEL":
            {
                Arity(3);
                var g = Coerce(args[0], StTypes.Bool, call.Arguments[0].Location, "as SEL's selector G");
                var type = CommonOf(args.Skip(1).ToList(), call);
                var in0 = Coerce(args[1], type, call.Arguments[1].Location, "to SEL");
                var in1 = Coerce(args[2], type, call.Arguments[2].Location, "to SEL");
                return new Bound(type, $"({g} ? {in1} : {in0})");
            }
        }

        var split = name.IndexOf("_TO_", StringComparison.Ordinal);
        if (split > 0 && StTypes.Elementary(name[..split]) is { IsNumeric: true } from && StTypes.Elementary(name[(split + 4)..]) is { IsNumeric: true } to)
        {
            Arity(1);
            var x = Coerce(args[0], from, call.Arguments[0].Location, $"to {name}");
            return new Bound(to, Conversion(x, from, to, call.Location));
        }

        if (_pous.ContainsKey(call.Function))
            throw Error(call, $"'{call.Function}' is a function block; declare an instance and call it as a statement");
        throw Error(call, $"function '{call.Function}' is not in the Structured Text subset verify reads (SQRT, ABS, MIN, MAX, LIMIT, SEL and numeric X_TO_Y conversions)");
    }

    /// <summary>SQRT, ABS, MIN, MAX and LIMIT of literals only are literals themselves, so their context types them (as it would the literal).</summary>
    private static Bound? FoldFunction(string name, List<Bound> args, StCallExpression call)
    {
        var integers = args.All(a => a.Type.Kind == StKind.AnyInt);
        var values = args.Select(LiteralDouble).ToList();
        double? result = name switch
        {
            "SQRT" when args.Count == 1 => Math.Sqrt(values[0]),
            "ABS" when args.Count == 1 => Math.Abs(values[0]),
            "MIN" when args.Count >= 2 => values.Min(),
            "MAX" when args.Count >= 2 => values.Max(),
            "LIMIT" when args.Count == 3 => Math.Min(Math.Max(values[1], values[0]), values[2]),
            _ => null,
        };
        if (result is not { } value) return null;
        if (!double.IsFinite(value)) throw Error(call, $"{name} of these constants is not a finite number");
        if (integers && name != "SQRT")
        {
            var integer = name switch
            {
                "ABS" => args[0].IntegerValue == long.MinValue ? throw Error(call, "integer constant too large") : Math.Abs(args[0].IntegerValue),
                "MIN" => args.Min(a => a.IntegerValue),
                "MAX" => args.Max(a => a.IntegerValue),
                _ => Math.Min(Math.Max(args[1].IntegerValue, args[0].IntegerValue), args[2].IntegerValue),
            };
            return new Bound(StTypes.AnyInt, "", integer);
        }
        return new Bound(StTypes.AnyReal, "", RealText: value.ToString("R", CultureInfo.InvariantCulture));
    }

    private static StType CommonOf(IReadOnlyList<Bound> args, StNode at)
    {
        var typed = args.Where(a => !a.Type.IsUntyped).Select(a => a.Type).ToList();
        if (typed.Count == 0) return args.Any(a => a.Type.Kind == StKind.AnyReal) ? StTypes.Lreal : StTypes.Dint;
        var type = typed[0];
        foreach (var next in typed.Skip(1))
        {
            if (StTypes.Same(type, next)) continue;
            if (StTypes.Widens(type, next)) type = next;
            else if (!StTypes.Widens(next, type))
                throw Error(at, $"{type.Display} and {next.Display} do not mix without a conversion function");
        }
        return type;
    }

    /// <summary>
    /// Numeric conversions: integers to integers checked against the target range; integers
    /// and LREAL to REAL round to nearest (IEEE 754); REAL and LREAL to integers round to
    /// nearest, halves away from zero, and out of range is an error.
    /// </summary>
    private string Conversion(string x, StType from, StType to, SourceLocation at)
    {
        if (ReferenceEquals(from, to)) return x;
        if (from.IsInteger && to.IsInteger)
        {
            if (from.Min >= to.Min && from.Max <= to.Max) return $"(({to.CsName}){x})";
            return $"(({to.CsName})StRt.Fit({x}, {to.Min}L, {to.Max}L, {Loc(at)}, \"{to.Name}\"))";
        }
        if (to.IsReal && (from.IsInteger || from.Kind == StKind.Real)) return $"(({to.CsName}){x})";
        if (from.Kind == StKind.Lreal && to.Kind == StKind.Real) return $"StRt.ToReal({x}, {Loc(at)})";
        if (from.IsReal && to.IsInteger) return $"(({to.CsName})StRt.Round({x}, {to.Min}L, {to.Max}L, {Loc(at)}, \"{to.Name}\"))";
        throw Error(at, $"{from.Name}_TO_{to.Name} is not in the Structured Text subset verify reads");
    }
}
