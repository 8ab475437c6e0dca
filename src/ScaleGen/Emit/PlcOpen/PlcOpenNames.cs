using System.Xml.Linq;

namespace ScaleGen.Emit.PlcOpen;

/// <summary>The names and fixed values of the PLCopen TC6 XML export, in one place.</summary>
public static class PlcOpenNames
{
    /// <summary>The file `build --only plcopen` writes.</summary>
    public const string FileName = "plant.xml";

    /// <summary>The TC6 XML v2.01 namespace (schemas/tc6_xml_v201.xsd).</summary>
    public static readonly XNamespace Tc6 = "http://www.plcopen.org/xml/tc6_0201";

    /// <summary>Documentation and ST bodies are XHTML inside these elements.</summary>
    public static readonly XNamespace Xhtml = "http://www.w3.org/1999/xhtml";

    /// <summary>
    /// fileHeader/@creationDateTime. The schema requires a date and time; ScaleGen outputs
    /// carry no timestamps (the same input gives the same bytes), so it is this fixed value,
    /// which says nothing about when the file was made.
    /// </summary>
    public const string CreationDateTime = "2000-01-01T00:00:00";

    /// <summary>instances: one configuration with one resource with one cyclic task that runs the program.</summary>
    public const string Configuration = "SG_Config";
    public const string Resource = "SG_Resource";
    public const string Task = "SG_CyclicTask";
    public const string ProgramInstance = "SG_PlantInstance";

    /// <summary>
    /// The task priority the schema requires. A placeholder: priorities depend on the
    /// controller's task plan, which the integrator sets.
    /// </summary>
    public const int TaskPriority = 1;
}
