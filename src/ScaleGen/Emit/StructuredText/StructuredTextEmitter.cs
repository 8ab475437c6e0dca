namespace ScaleGen.Emit.StructuredText;

/// <summary>
/// `build --only st`: portable IEC 61131-3 Structured Text, library.st (types and blocks,
/// the same for every plant) and plant.st (the plant's program).
/// </summary>
public sealed class StructuredTextEmitter : IOutputEmitter
{
    public string Kind => "st";

    public IEnumerable<GeneratedFile> Emit(EmitContext context) =>
    [
        new GeneratedFile(StNames.LibraryFile, StLibrary.Text(context)),
        new GeneratedFile(StNames.PlantFile, output => StPlant.Write(output, context)),
    ];
}
