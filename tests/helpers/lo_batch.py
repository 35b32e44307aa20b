#!/usr/bin/python3
# Drives one headless LibreOffice Calc (python3-uno) through a batch of jobs, as a grower
# would by hand: open a workbook, delete rows, type into cells, save as .xlsx, as CSV with
# the filter's default options ("as shown"), or as PDF. One soffice start per batch.
#
#   lo_batch.py <profile-dir> <jobs.json>
#
# jobs.json: [{ "open": path, "ops": [...], "save": [{"path": p, "as": "xlsx"|"csv"|"pdf", "sheet"?: name}] }]
# ops: {"deleteRow": {"sheet": name, "row": n}}   (n as the spreadsheet shows it, header = 1)
#      {"set": {"sheet": name, "cell": "F2", "value": 30}}   (number, or text typed as is)
#      {"copyRow": {"sheet": name, "from": n, "to": m}}      (insert a copy of row n before row m)
import json, os, subprocess, sys, time, uno
from com.sun.star.beans import PropertyValue

def prop(name, value):
    p = PropertyValue()
    p.Name = name
    p.Value = value
    return p

def main():
    profile, jobs_path = sys.argv[1], sys.argv[2]
    jobs = json.load(open(jobs_path))
    pipe = "fc%d" % os.getpid()
    office = subprocess.Popen([
        "soffice", "--headless", "--invisible", "--norestore", "--nologo", "--nodefault",
        "-env:UserInstallation=file://" + profile, "--accept=pipe,name=%s;urp;" % pipe
    ], stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    try:
        local = uno.getComponentContext()
        resolver = local.ServiceManager.createInstanceWithContext("com.sun.star.bridge.UnoUrlResolver", local)
        ctx = None
        for _ in range(600):
            try:
                ctx = resolver.resolve("uno:pipe,name=%s;urp;StarOffice.ComponentContext" % pipe)
                break
            except Exception:
                time.sleep(0.1)
        if ctx is None:
            raise SystemExit("soffice did not answer")
        desktop = ctx.ServiceManager.createInstanceWithContext("com.sun.star.frame.Desktop", ctx)
        for job in jobs:
            url = uno.systemPathToFileUrl(os.path.abspath(job["open"]))
            doc = desktop.loadComponentFromURL(url, "_blank", 0, (prop("Hidden", True),))
            sheets = doc.Sheets
            for op in job.get("ops", []):
                if "deleteRow" in op:
                    o = op["deleteRow"]
                    sheets.getByName(o["sheet"]).Rows.removeByIndex(o["row"] - 1, 1)
                elif "copyRow" in op:
                    o = op["copyRow"]
                    sh = sheets.getByName(o["sheet"])
                    sh.Rows.insertByIndex(o["to"] - 1, 1)
                    src = o["from"] if o["from"] < o["to"] else o["from"] + 1
                    source = sh.getCellRangeByName("A%d:AZ%d" % (src, src)).RangeAddress
                    target = sh.getCellByPosition(0, o["to"] - 1).CellAddress
                    sh.copyRange(target, source)
                elif "set" in op:
                    o = op["set"]
                    cell = sheets.getByName(o["sheet"]).getCellRangeByName(o["cell"])
                    v = o["value"]
                    if isinstance(v, (int, float)):
                        cell.setValue(v)
                    else:
                        cell.setString(v)
            for s in job.get("save", []):
                out = uno.systemPathToFileUrl(os.path.abspath(s["path"]))
                kind = s["as"]
                if kind == "xlsx":
                    doc.storeToURL(out, (prop("FilterName", "Calc MS Excel 2007 XML"),))
                elif kind == "csv":
                    if "sheet" in s:
                        # The CSV filter writes the sheet in front (the hidden document's active one).
                        sheets.moveByName(s["sheet"], 0)
                        doc.CurrentController.setActiveSheet(sheets.getByIndex(0))
                    # The options Calc's "Keep current format" dialog offers by default: comma, double
                    # quotes, UTF-8, "Save cell content as shown" on. (Without FilterOptions the
                    # API writes raw values, which is not what a grower pressing Save gets.)
                    doc.storeToURL(out, (prop("FilterName", "Text - txt - csv (StarCalc)"),
                                         prop("FilterOptions", "44,34,76,1,,0,false,true,true,false,false")))
                elif kind == "pdf":
                    doc.storeToURL(out, (prop("FilterName", "calc_pdf_Export"),))
            doc.close(True)
    finally:
        try:
            desktop.terminate()
        except Exception:
            pass
        try:
            office.wait(timeout=20)
        except Exception:
            office.kill()

main()
